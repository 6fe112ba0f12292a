/**
 * One check per claim kind. Each recomputes what its claim asserts from the components and the data and
 * returns the problems it finds (empty when the claim is true). The table is typed over every ClaimKind,
 * so a new kind does not type-check until it has its check.
 */
import type { ClaimKind, ClaimKinds } from '../vocabulary/claims.js';
import { checkComparison } from './check-comparison.js';
import { checkEasterMonths, checkLevelStep, checkNamedEvent, checkWorkingDays } from './check-effects.js';
import { checkFirmness } from './check-firmness.js';
import { checkPublishedFirmness, checkSinceLastBrief, checkSourceRevisions } from './check-history.js';
import { checkHistoryLimit } from './check-history-limit.js';
import { checkLatestValue } from './check-latest.js';
import { checkSeasonalPeakLow } from './check-seasonal.js';
import { checkIdentifiableSeasonality, checkResidualSeasonality } from './check-seasonality.js';
import { checkLatestChange, checkSensitivity, checkTrendDirection, checkTrendYearlyChange } from './check-trend.js';
import { checkUnusualCount } from './check-unusual.js';
import { checkYearlyTotals } from './check-yearly-totals.js';
import type { VerifyContext } from './context.js';

export type Check<K extends ClaimKind> = (claim: ClaimKinds[K], ctx: VerifyContext) => string[];

export const CHECKS: { [K in ClaimKind]: Check<K> } = {
  'trend-yearly-change': checkTrendYearlyChange,
  'trend-direction': checkTrendDirection,
  'latest-change': checkLatestChange,
  'seasonal-peak-low': checkSeasonalPeakLow,
  comparison: checkComparison,
  'unusual-count': checkUnusualCount,
  firmness: checkFirmness,
  sensitivity: checkSensitivity,
  'since-last-brief': checkSinceLastBrief,
  'source-revisions': checkSourceRevisions,
  'published-firmness': checkPublishedFirmness,
  'latest-value': checkLatestValue,
  'identifiable-seasonality': checkIdentifiableSeasonality,
  'residual-seasonality': checkResidualSeasonality,
  'yearly-totals': checkYearlyTotals,
  'working-days': checkWorkingDays,
  'level-step': checkLevelStep,
  'named-event': checkNamedEvent,
  'easter-months': checkEasterMonths,
  'history-limit': checkHistoryLimit,
  none: () => [],
};
