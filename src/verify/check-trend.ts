/**
 * Checks of the trend claims: its change over a year and the direction word the materiality rule gives
 * it, the tile's run of steps, the latest period's split into season and the rest, and the direction the
 * sensitivity statement says the trend's last step has.
 */
import type {
  DirectionWord,
  LatestChangeClaim,
  Materiality,
  SensitivityClaim,
  TrendDirectionClaim,
  TrendYearlyChangeClaim,
} from '../vocabulary/claims.js';
import { YEAR_OF_PERIODS } from './check-history-limit.js';
import type { VerifyContext } from './context.js';
import { ms } from './dates.js';
import { agrees, median, quantile7 } from './numbers.js';
import { directionWordsProblem } from './words.js';
import { isYearBefore } from './year-back.js';

export function checkTrendYearlyChange(c: TrendYearlyChangeClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const out: string[] = [];
  const i = ctx.indexOf(c.at);
  const j = ctx.indexOf(c.base);
  if (c.at !== s.reportingDate) out.push(`is about ${c.at}, not the reporting period ${s.reportingDate}`);
  if (i < 0 || j < 0) return [...out, 'names a period outside the series'];
  if (c.over === undefined) {
    if (!isYearBefore(s.frequency, c.base, c.at))
      out.push(`compares with ${c.base}, which is not a year before ${c.at}`);
  } else {
    // A shorter span only where two years are not there, and it is what the claim says.
    if (s.reportingIndex + 1 >= 2 * YEAR_OF_PERIODS[s.frequency] + 1)
      out.push(`gives the change over ${c.over} periods though the data hold two years`);
    if (i - j !== c.over) out.push(`compares with ${c.base}, ${i - j} periods back, not ${c.over}`);
  }
  const t = s.components.trend;
  const change = t[i] - t[j];
  if (!agrees(c.change, change, ctx.scale)) out.push(`change ${c.change} but the trend moved ${change}`);
  const stated = statedChange(c.expression, t[i], t[j], out);
  if (!agrees(c.value, stated, c.expression === 'relative' ? 100 : ctx.scale)) {
    out.push(`states ${c.value} but the trend's ${c.expression} change is ${stated}`);
  }
  const word = Number.isFinite(stated) && c.materiality ? verdict(stated, c.materiality) : 'unknown';
  if (c.direction !== word) out.push(`says ${c.direction}, the materiality rule gives ${word}`);
  if (c.materiality) out.push(...checkMateriality(c.materiality, c, ctx));
  const words = directionWordsProblem(ctx.statement.text, c.direction);
  if (words) out.push(`the words ${words}`);
  return out;
}

/** The change as words state it: percent of a positive base, or units. */
function statedChange(expression: 'relative' | 'absolute', now: number, base: number, out: string[]): number {
  if (expression === 'absolute') return now - base;
  if (!(base > 0)) {
    if (Number.isFinite(base))
      out.push(`expresses as a percent a change from a base of ${base}, which is not positive`);
    return Number.NaN;
  }
  return 100 * (now / base - 1);
}

function verdict(value: number, m: Materiality): DirectionWord {
  const unchanged = m.rule === 'revision-range' ? value + m.low <= 0 && value + m.high >= 0 : Math.abs(value) <= m.high;
  return unchanged ? 'broadly-unchanged' : value > 0 ? 'rising' : 'falling';
}

/** The materiality range is the one its rule defines, recomputed here. */
function checkMateriality(m: Materiality, c: TrendYearlyChangeClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  if (m.rule === 'revision-range') {
    const later = s.analysis.firmness.revisions.map((r) => r.latest - r.first);
    const lo = quantile7(later, 0.1);
    const hi = quantile7(later, 0.9);
    if (!agrees(m.low, lo, 100, 1e-9) || !agrees(m.high, hi, 100, 1e-9)) {
      return [`uses the range [${m.low}, ${m.high}], the revisions (later minus earlier) give [${lo}, ${hi}]`];
    }
    return [];
  }
  const k = s.components;
  const mult = s.settings.model === 'multiplicative';
  const misfit: number[] = [];
  for (let i = 0; i < k.observed.length; i++) {
    const v = mult ? k.observed[i] - k.trend[i] * k.seasonal[i] : k.observed[i] - k.trend[i] - k.seasonal[i];
    if (!Number.isNaN(v)) misfit.push(v);
  }
  const mid = median(misfit);
  let noise = 1.4826 * median(misfit.map((v) => Math.abs(v - mid)));
  if (c.expression === 'relative') noise = (100 * noise) / k.trend[ctx.indexOf(c.base)];
  return agrees(m.high, noise, Math.abs(noise), 1e-9) ? [] : [`noise threshold ${m.high}, recomputed ${noise}`];
}

/** Whether the trend stepped up (1), down (−1) or not at all (0) into index t. */
function step(t: ArrayLike<number>, i: number): number {
  const d = t[i] - t[i - 1];
  if (Number.isNaN(d)) return Number.NaN;
  return Math.abs(d) <= 1e-9 * Math.max(1, Math.abs(t[i])) ? 0 : Math.sign(d);
}

export function checkTrendDirection(c: TrendDirectionClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  const head = ctx.s.statements.flatMap((x) => x.claims).find((x) => x.kind === 'trend-yearly-change');
  if (head && head.kind === 'trend-yearly-change' && head.direction !== c.direction) {
    out.push(`says ${c.direction} while the headline says ${head.direction}`);
  }
  const i = ctx.indexOf(c.at);
  const want = c.direction === 'rising' ? 1 : c.direction === 'falling' ? -1 : 0;
  let run = 0;
  if (want !== 0) for (let t = i; t >= 1 && step(ctx.s.components.trend, t) === want; t--) run++;
  if (c.run !== run) out.push(`says ${c.run} periods in a row, the trend gives ${run}`);
  const words = directionWordsProblem(ctx.statement.text, c.direction);
  if (words && c.direction !== 'unknown') out.push(`the words ${words}`);
  return out;
}

export function checkLatestChange(c: LatestChangeClaim, ctx: VerifyContext): string[] {
  const k = ctx.s.components;
  const i = ctx.indexOf(c.at);
  const j = ctx.indexOf(c.previous);
  if (i < 0 || j !== i - 1) return ['does not compare a period with the one before'];
  const out: string[] = [];
  const raw = k.observed[i] - k.observed[j];
  const beyond = k.adjusted[i] - k.adjusted[j];
  if (!agrees(c.raw, raw, ctx.scale)) out.push(`raw change ${c.raw}, data ${raw}`);
  if (!agrees(c.beyondSeason, beyond, ctx.scale))
    out.push(`change beyond the season ${c.beyondSeason}, adjusted ${beyond}`);
  if (!agrees(c.seasonal, raw - beyond, ctx.scale)) out.push(`seasonal part ${c.seasonal}, recomputed ${raw - beyond}`);
  return out;
}

export function checkSensitivity(c: SensitivityClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  const i = ctx.indexOf(c.at);
  if (i !== ctx.s.reportingIndex) out.push('is not about the reporting period');
  const st = step(ctx.s.components.trend, i);
  if (st !== (c.stepDirection === 'rising' ? 1 : -1)) out.push(`says the trend's last step is ${c.stepDirection}`);
  if (!(ms(c.next) > ms(c.at))) out.push('names a next period that is not after the reporting period');
  if (!Number.isFinite(c.value)) out.push('gives no value');
  return out;
}
