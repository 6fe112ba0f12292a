/**
 * The overview statement of a series: its latest value, the trend's direction and change over a year, how
 * much first estimates of that change typically move, and how many periods stood out — the row a reader of
 * a brief of several series sees first. It restates what the series' other statements claim (the same
 * claim objects, so the verifier checks the same facts again) and adds the latest value's own claim.
 * Its figures are named (latest, latestPeriod, direction, trendChange, revision, unusualCount, unusualSpan)
 * so the overview's cells can show them one by one.
 */

import type { Figure, SeriesBrief, Statement } from '../vocabulary/brief.js';
import type {
  Claim,
  FirmnessClaim,
  LatestValueClaim,
  TrendYearlyChangeClaim,
  UnusualCountClaim,
} from '../vocabulary/claims.js';
import { ordinalAt } from '../vocabulary/period-index.js';
import { countNoun, formatNumber, formatPercent, formatPeriod, unitAround } from './format.js';
import { type Part, statement } from './statement.js';
import { periodNoun, spanBack, unitWords } from './wording.js';

const DIRECTION = { rising: 'up', falling: 'down', 'broadly-unchanged': 'broadly unchanged' } as const;
const YEARS: Record<number, string> = { 1: 'one', 2: 'two', 3: 'three', 4: 'four', 5: 'five' };

export function narrateOverview(s: SeriesBrief, statements: Statement[], locale: string): Statement {
  const claims = statements.flatMap((x) => x.claims);
  const find = <K extends Claim['kind']>(kind: K) =>
    claims.find((c) => c.kind === kind) as Extract<Claim, { kind: K }> | undefined;
  const fig = (name: string, value: number | string, unit: string, formatted: string): Figure => ({
    name,
    value,
    unit,
    formatted,
  });
  const period = (i: number) => formatPeriod(s.frequency, ordinalAt(s.periodIndex, i), locale);
  const amount = (name: string, v: number): Part[] => {
    const { before, after } = unitAround(unitWords(s.unit, Math.abs(v)), locale);
    return [before, fig(name, v, s.unit, formatNumber(Math.abs(v), locale)), after];
  };

  const at = s.components.dates[s.reportingIndex];
  const latest = s.components.observed[s.reportingIndex];
  const parts: Part[] = [`${s.label}: `];
  const out: Claim[] = [];
  if (Number.isNaN(latest))
    parts.push('no value in ', fig('latestPeriod', at, 'period', period(s.reportingIndex)), '.');
  else {
    const claim: LatestValueClaim = { kind: 'latest-value', at, value: latest };
    out.push(claim);
    const { before, after } = unitAround(unitWords(s.unit, Math.abs(latest)), locale);
    parts.push(before, fig('latest', latest, s.unit, formatNumber(latest, locale)), after);
    const on = s.frequency === 'daily' || s.frequency === 'hourly';
    parts.push(on ? ' on ' : ' in ', fig('latestPeriod', at, 'period', period(s.reportingIndex)), '.');
  }

  const trend = find('trend-yearly-change') as TrendYearlyChangeClaim | undefined;
  if (trend && trend.direction !== 'unknown' && Number.isFinite(trend.value)) {
    out.push(trend);
    parts.push(' The trend is ', fig('direction', trend.direction, 'direction', DIRECTION[trend.direction]));
    if (trend.direction !== 'broadly-unchanged') {
      parts.push(' ');
      if (trend.expression === 'relative')
        parts.push(fig('trendChange', trend.value, '%', formatPercent(Math.abs(trend.value), locale, false)));
      else parts.push(...amount('trendChange', trend.value));
    }
    parts.push(trend.over === undefined ? ' on a year.' : ` on ${spanBack(s.frequency, trend.over, false)}.`);
  }

  const firm = find('firmness') as FirmnessClaim | undefined;
  if (firm && firm.periodsChecked > 0 && Number.isFinite(firm.meanAbsoluteRevision) && trend) {
    out.push(firm);
    parts.push(' First estimates of that change are typically revised by ');
    if (trend.expression === 'relative')
      parts.push(
        fig(
          'revision',
          firm.meanAbsoluteRevision,
          'percentage points',
          formatNumber(firm.meanAbsoluteRevision, locale, 1),
        ),
        ' points.',
      );
    else parts.push(...amount('revision', firm.meanAbsoluteRevision), '.');
  }

  const unusual = find('unusual-count') as UnusualCountClaim | undefined;
  if (unusual) {
    out.push(unusual);
    const noun = periodNoun(s.frequency);
    const span =
      unusual.years > 0
        ? `in the last ${YEARS[unusual.years] ?? unusual.years} years`
        : `since ${period(s.analysis.recentSpan.from)}`;
    const count = fig(
      'unusualCount',
      unusual.count,
      noun,
      unusual.count === 0 ? `No ${noun}` : countNoun(unusual.count, noun, locale),
    );
    parts.push(' ', count, ' ', fig('unusualSpan', unusual.span.from, 'span', span), ' stood out.');
  }
  return statement('overview', 'overview', parts, out.length > 0 ? out : [{ kind: 'none' }]);
}
