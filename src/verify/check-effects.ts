/**
 * Checks of the statements about calendar effects and events, recomputed from the components and the
 * calendar with the verifier's own arithmetic:
 * - working days: Monday to Friday counted day by day in each period named, the two periods a year apart,
 *   and the change of observed less (over) the calendar component, relative only of a positive base;
 * - a step: the jump of the trend's step part (components.steps) across it, its sign and size;
 * - a named event: the one-off part of the remainder at its period, its sign and size;
 * - Easter: the month of Easter Sunday by Oudin's algorithm (1940; as given in the Explanatory Supplement to
 *   the Astronomical Almanac, 1992, §12.22 — from memory), a different route from the pipeline's.
 * Sizes said "about" are two significant digits of the claim's value; the claim's value itself must agree
 * with the recomputation to 1e-9.
 */
import type { EasterMonthsClaim, LevelStepClaim, NamedEventClaim, WorkingDaysClaim } from '../vocabulary/claims.js';
import type { VerifyContext } from './context.js';
import { ms, weekdayOf } from './dates.js';
import { agrees } from './numbers.js';
import { isYearBefore } from './year-back.js';

const DAY = 86_400_000;

/** Monday-to-Friday days from the period's first day up to the next period's. */
function weekdaysIn(iso: string, frequency: string): number {
  const start = ms(iso);
  const d = new Date(start);
  const months = frequency === 'quarterly' ? 3 : 1;
  const end = Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + months, 1);
  let count = 0;
  for (let t = start; t < end; t += DAY) if (weekdayOf(t) < 5) count++;
  return count;
}

/** How many of `holidays` are Monday-to-Friday days of the period, counted twice: in it, and off work. */
function weekdayHolidaysIn(iso: string, frequency: string, holidays: readonly string[]): [number, number] {
  const start = ms(iso);
  const d = new Date(start);
  const end = Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + (frequency === 'quarterly' ? 3 : 1), 1);
  let n = 0;
  for (const h of new Set(holidays)) {
    const t = ms(h);
    if (t >= start && t < end && weekdayOf(t) < 5) n++;
  }
  return [n, n];
}

export function checkWorkingDays(c: WorkingDaysClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const out: string[] = [];
  if (s.frequency !== 'monthly' && s.frequency !== 'quarterly') out.push(`working days stated for ${s.frequency} data`);
  if (!isYearBefore(s.frequency, c.base, c.at)) out.push(`${c.base} is not a year before ${c.at}`);
  if (c.at !== s.components.dates[s.reportingIndex]) out.push(`names ${c.at}, not the reporting period`);
  const listed = new Set(s.effects?.holidays ?? []);
  for (const [iso, stated, holidays] of [
    [c.at, c.daysAt, c.holidaysAt],
    [c.base, c.daysBase, c.holidaysBase],
  ] as const) {
    const [inPeriod, off] = weekdayHolidaysIn(iso, s.frequency, holidays);
    if (inPeriod !== holidays.length || new Set(holidays).size !== holidays.length) {
      out.push(`the holidays counted out of ${iso} are not distinct weekdays of that period`);
    }
    for (const h of holidays) if (!listed.has(h)) out.push(`${h} is not one of the brief's holidays`);
    const counted = weekdaysIn(iso, s.frequency) - off;
    if (counted !== stated) {
      out.push(
        `${iso} has ${counted} working days (Monday to Friday${off ? ` less ${off} holidays` : ''}), not ${stated}`,
      );
    }
  }
  if (!c.allowed) {
    if (!Number.isNaN(c.value)) out.push('states a change allowing for working days that were not allowed for');
    return out;
  }
  const cal = s.components.calendar;
  if (!cal) return [...out, 'allows for working days, but the brief has no calendar component'];
  const mult = s.settings.model === 'multiplicative';
  const i = ctx.indexOf(c.at);
  const j = ctx.indexOf(c.base);
  const o = s.components.observed;
  const a = mult ? o[i] / cal[i] : o[i] - cal[i];
  const b = mult ? o[j] / cal[j] : o[j] - cal[j];
  if (c.expression === 'relative' && !(b > 0)) out.push(`a percent of a base that is not positive (${b})`);
  const value = c.expression === 'relative' ? 100 * (a / b - 1) : a - b;
  if (!agrees(c.value, value, c.expression === 'relative' ? Math.abs(value) : ctx.scale)) {
    out.push(`states a change of ${c.value} allowing for the calendar; recomputed ${value}`);
  }
  return out;
}

export function checkLevelStep(c: LevelStepClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const steps = s.components.steps;
  if (!steps) return ['states a step, but the brief has no step component'];
  const i = ctx.indexOf(c.from);
  const k = ctx.indexOf(c.to);
  if (i < 1 || k < i) return [`no step can start at ${c.from} and end at ${c.to}`];
  const out: string[] = [];
  if (c.label !== null && !ctx.statement.text.includes(c.label))
    out.push(`the words do not repeat the label "${c.label}"`);
  const mult = s.settings.model === 'multiplicative';
  const before = steps[i - 1];
  const after = steps[k];
  const jump =
    c.expression === 'relative'
      ? 100 * (after / before - 1)
      : mult
        ? (after / before - 1) * (s.components.trend[i - 1] / before)
        : after - before;
  if (c.expression === 'relative' && !(before > 0)) out.push('a percent of a step part that is not positive');
  if (c.direction !== 'unclear' && (jump > 0 ? 'up' : 'down') !== c.direction) {
    out.push(`says the level went ${c.direction}; the step part moved by ${jump}`);
  }
  if (!agrees(c.size, Math.abs(jump), Math.abs(jump)))
    out.push(`states a step of ${c.size}; recomputed ${Math.abs(jump)}`);
  return out;
}

export function checkNamedEvent(c: NamedEventClaim, ctx: VerifyContext): string[] {
  const { s } = ctx;
  const part = s.components.oneOff;
  if (!part) return ['names an event, but the brief has no one-off component'];
  const i = ctx.indexOf(c.at);
  if (i < 0) return [`${c.at} is not a period of the series`];
  const out: string[] = [];
  if (!ctx.statement.text.includes(c.label)) out.push(`the words do not repeat the label "${c.label}"`);
  const mult = s.settings.model === 'multiplicative';
  const size = mult ? 100 * (part[i] - 1) : part[i];
  if ((size > 0 ? 'above' : 'below') !== c.direction) out.push(`says ${c.direction}; the one-off part is ${size}`);
  if (!agrees(c.size, Math.abs(size), Math.abs(size))) out.push(`states ${c.size}; recomputed ${Math.abs(size)}`);
  return out;
}

/** Easter Sunday's month by Oudin's algorithm (integer arithmetic throughout). */
function easterMonth(y: number): number {
  const div = (a: number, b: number) => Math.floor(a / b);
  const c = div(y, 100);
  const n = y - 19 * div(y, 19);
  const k = div(c - 17, 25);
  let i = c - div(c, 4) - div(c - k, 3) + 19 * n + 15;
  i = i - 30 * div(i, 30);
  i = i - div(i, 28) * (1 - div(i, 28) * div(29, i + 1) * div(21 - n, 11));
  let j = y + div(y, 4) + i + 2 - c + div(c, 4);
  j = j - 7 * div(j, 7);
  const l = i - j;
  return 3 + div(l + 40, 44);
}

export function checkEasterMonths(c: EasterMonthsClaim, ctx: VerifyContext): string[] {
  const out: string[] = [];
  const year = Number(ctx.s.components.dates[ctx.s.reportingIndex].slice(0, 4));
  if (c.year !== year) out.push(`"this year" is ${c.year}, but the reporting period is in ${year}`);
  if (easterMonth(c.year) !== c.month) out.push(`Easter ${c.year} was in month ${easterMonth(c.year)}, not ${c.month}`);
  if (easterMonth(c.year - 1) !== c.lastMonth) {
    out.push(`Easter ${c.year - 1} was in month ${easterMonth(c.year - 1)}, not ${c.lastMonth}`);
  }
  if (c.month === c.lastMonth) out.push('says Easter moved between months when it did not');
  return out;
}
