/**
 * Statements about the effects taken out before decomposition (brief/effects.ts): the reporting period's
 * working days against a year before and the change allowing for them; each step in the level (named or
 * found) with its size and the job's label; each one-off or fading event the job named; where Easter fell;
 * or, when the model could not be estimated, one plain sentence saying so. Sizes of estimates are given
 * "about", to two significant digits; the claims keep them unrounded.
 */

import { easterSunday } from '../calendar/easter-sunday.js';
import type { Figure, Statement } from '../vocabulary/brief.js';
import type { EasterMonthsClaim, LevelStepClaim, NamedEventClaim, WorkingDaysClaim } from '../vocabulary/claims.js';
import { yearLag } from '../vocabulary/period-index.js';
import { formatNumber, formatPercent } from './format.js';
import { statement } from './statement.js';
import type { Words } from './statements.js';
import { unitWords } from './wording.js';

type Part = string | Figure;

const SMALL = ['no', 'one', 'two', 'three', 'four', 'five'];
const MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
];

export function narrateEffects(w: Words): Statement[] {
  const { s } = w;
  const e = s.effects;
  if (!e) return [];
  if (e.skipped) {
    return s.settings.effects?.asked ? [statement('effects-skipped', 'effects', [e.skipped])] : [];
  }
  const out: Statement[] = [];
  const wd = workingDays(w);
  if (wd) out.push(wd);
  e.events.forEach((x, i) => {
    const st = x.kind === 'step' || x.kind === 'ramp' ? step(w, i) : x.label ? namedEvent(w, i) : null;
    if (st) out.push(st);
  });
  const easter = easterWords(w);
  if (easter) out.push(easter);
  return out;
}

/** Two significant digits: "about 300 ML", "about 4.2%". */
function about(v: number): number {
  if (!(v !== 0) || !Number.isFinite(v)) return v;
  const p = 10 ** (Math.floor(Math.log10(Math.abs(v))) - 1);
  return Math.round(v / p) * p;
}

function aboutSize(w: Words, name: string, v: number, relative: boolean): Part[] {
  if (relative) {
    const r = about(v);
    return [
      { name, value: v, unit: '%', formatted: formatPercent(Math.abs(r), w.locale, false, Math.abs(r) < 10 ? 1 : 0) },
    ];
  }
  const r = Math.abs(about(v));
  const u = unitWords(w.s.unit, r);
  return [{ name, value: v, unit: w.s.unit, formatted: formatNumber(r, w.locale) }, u ? ` ${u}` : ''];
}

function workingDays(w: Words): Statement | null {
  const { s } = w;
  const days = s.effects?.workingDays;
  const r = s.reportingIndex;
  const lag = yearLag(s.frequency);
  if (!days || r - lag < 0 || !Number.isFinite(days[r]) || !Number.isFinite(days[r - lag])) return null;
  const dates = s.components.dates;
  const kept = s.effects?.groups.some((g) => g.name === 'working days' && g.kept) ?? false;
  const diff = days[r] - days[r - lag];
  const parts: Part[] = [
    w.at('workingDays.at', r),
    ' had ',
    { name: 'workingDays.days', value: days[r], unit: 'working days', formatted: String(days[r]) },
    ' working days, ',
  ];
  if (diff === 0) parts.push('as many as ', w.at('workingDays.base', r - lag));
  else {
    const k = Math.abs(diff);
    parts.push(
      { name: 'workingDays.difference', value: diff, unit: 'working days', formatted: SMALL[k] ?? String(k) },
      diff < 0 ? (k === 1 ? ' fewer than ' : ' fewer than ') : ' more than ',
      w.at('workingDays.base', r - lag),
    );
  }
  const claim: WorkingDaysClaim = {
    kind: 'working-days',
    at: dates[r],
    base: dates[r - lag],
    daysAt: days[r],
    daysBase: days[r - lag],
    holidaysAt: within(s.effects?.holidays ?? [], dates[r], dates[r + 1] ?? null),
    holidaysBase: within(s.effects?.holidays ?? [], dates[r - lag], dates[r - lag + 1]),
    allowed: kept && !!s.components.calendar,
    expression: s.changeExpression,
    value: Number.NaN,
  };
  if (claim.allowed) {
    const mult = s.settings.model === 'multiplicative';
    const cal = s.components.calendar!;
    const o = s.components.observed;
    const a = mult ? o[r] / cal[r] : o[r] - cal[r];
    const b = mult ? o[r - lag] / cal[r - lag] : o[r - lag] - cal[r - lag];
    const relative = w.relative && b > 0;
    claim.expression = relative ? 'relative' : 'absolute';
    claim.value = relative ? 100 * (a / b - 1) : a - b;
    if (!Number.isFinite(claim.value)) return null;
    parts.push('. Allowing for that, the change on a year earlier is ');
    if (claim.value === 0) parts.push('nil.');
    else {
      parts.push(claim.value > 0 ? 'a rise of ' : 'a fall of ');
      parts.push(...w.size('workingDays.change', claim.value, relative), '.');
    }
  } else {
    parts.push('. The brief makes no allowance for it: it made no clear difference.');
  }
  return statement('working-days', 'effects', parts, [claim]);
}

function step(w: Words, i: number): Statement | null {
  const { s } = w;
  const x = s.effects!.events[i];
  const steps = s.components.steps;
  if (!steps) return null;
  const dates = s.components.dates;
  const ramp = x.kind === 'ramp';
  const named = s.settings.effects?.events.find((v) => v.at === x.at && v.label === x.label);
  const to = ramp && named?.until != null ? named.until : x.at;
  if (x.at < 1) return null;
  const mult = s.settings.model === 'multiplicative';
  const before = steps[x.at - 1];
  const after = steps[to];
  const relative = mult && w.relative && before > 0;
  const size = relative
    ? 100 * (after / before - 1)
    : mult
      ? ((after / before - 1) * s.components.trend[x.at - 1]) / before
      : after - before;
  if (!Number.isFinite(size) || size === 0) return null;
  const clear = Math.abs(x.t) >= 1.96;
  const claim: LevelStepClaim = {
    kind: 'level-step',
    from: dates[x.at],
    to: dates[to],
    label: x.label,
    direction: clear ? (size > 0 ? 'up' : 'down') : 'unclear',
    expression: relative ? 'relative' : 'absolute',
    size: Math.abs(size),
  };
  const label: Part[] = x.label ? [' (', x.label, ')'] : [];
  const sizeParts = aboutSize(w, `step${i}.size`, size, relative);
  let parts: Part[];
  if (!clear) {
    parts = [
      'The brief finds no clear change of level ',
      w.when(),
      ' ',
      w.at(`step${i}.from`, x.at),
      ...label,
      '. The estimate, about ',
      ...sizeParts,
      size > 0 ? ' up' : ' down',
      ', is within twice its uncertainty. The trend includes it.',
    ];
  } else if (ramp) {
    parts = [
      'From ',
      w.at(`step${i}.from`, x.at),
      ' to ',
      w.at(`step${i}.to`, to),
      ...label,
      ` the level ${size > 0 ? 'rose' : 'fell'} by about `,
      ...sizeParts,
      `. The trend includes that ${size > 0 ? 'rise' : 'fall'}.`,
    ];
  } else {
    parts = [
      'From ',
      w.at(`step${i}.from`, x.at),
      ...label,
      ` the level stepped ${size > 0 ? 'up' : 'down'} by about `,
      ...sizeParts,
      x.label ? '' : ' (found in the data)',
      '. The trend includes that step.',
    ];
  }
  return statement(`step-${i}`, 'effects', parts, [claim]);
}

function namedEvent(w: Words, i: number): Statement | null {
  const { s } = w;
  const x = s.effects!.events[i];
  const part = s.components.oneOff;
  if (!part || !x.label) return null;
  const mult = s.settings.model === 'multiplicative';
  const size = mult ? 100 * (part[x.at] - 1) : part[x.at];
  if (!Number.isFinite(size) || size === 0) return null;
  const claim: NamedEventClaim = {
    kind: 'named-event',
    at: s.components.dates[x.at],
    label: x.label,
    direction: size > 0 ? 'above' : 'below',
    expression: mult ? 'relative' : 'absolute',
    size: Math.abs(size),
  };
  const what =
    x.kind === 'fading'
      ? 'The jump fades over the next periods and is left out of the trend.'
      : 'This one-off is left out of the trend.';
  return statement(
    `event-${i}`,
    'effects',
    [
      x.label,
      ' (',
      w.at(`event${i}.at`, x.at),
      '): about ',
      ...aboutSize(w, `event${i}.size`, size, mult),
      size > 0 ? ' above' : ' below',
      ' the usual pattern. ',
      what,
    ],
    [claim],
  );
}

function easterWords(w: Words): Statement | null {
  const { s } = w;
  if (!s.settings.effects || s.settings.effects.easterDays === null) return null;
  if (s.frequency !== 'monthly' && s.frequency !== 'quarterly') return null;
  const iso = s.components.dates[s.reportingIndex];
  const year = Number(iso.slice(0, 4));
  const month = Number(iso.slice(5, 7));
  // Only when the reporting period is one Easter can fall in (March or April; the first two quarters).
  const easterTime = s.frequency === 'monthly' ? month === 3 || month === 4 : month <= 6;
  if (!easterTime) return null;
  const now = easterMonth(year);
  const last = easterMonth(year - 1);
  if (now === last) return null;
  const claim: EasterMonthsClaim = { kind: 'easter-months', year, month: now, lastMonth: last };
  return statement(
    'easter',
    'effects',
    [`Easter fell in ${MONTHS[now - 1]} this year and in ${MONTHS[last - 1]} last year.`],
    [claim],
  );
}

/** The month (1–12) of Easter Sunday in a year. */
function easterMonth(year: number): number {
  return new Date(easterSunday(year) * 86_400_000).getUTCMonth() + 1;
}

/** The dates from `from` up to (not including) `to`; to the end when `to` is null. */
function within(isoDates: string[], from: string, to: string | null): string[] {
  return isoDates.filter((d) => d >= from && (to === null || d < to));
}
