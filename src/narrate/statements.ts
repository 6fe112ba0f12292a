/**
 * Plain-language statements built only from figures of the Brief model. Each statement is assembled
 * from text and figure parts, so every number printed in its text is one of its figures' formatted
 * strings and a reviewer can trace it. Sentences are short and causal words are avoided: the brief says
 * what moved, never why.
 */
import type { BriefMeta, Figure, SeriesBrief, Statement } from '../brief/model.js';
import { type Frequency, ordinalOf } from '../data/calendar.js';
import { countNoun, countOf, formatNumber, formatPercent, formatPeriod, formatSigned } from './format.js';
import { judgement, periodNoun } from './wording.js';

type Part = string | Figure;

export function statement(id: string, kind: Statement['kind'], parts: Part[]): Statement {
  let text = '';
  const figures: Figure[] = [];
  for (const p of parts) {
    if (typeof p === 'string') text += p;
    else {
      text += p.formatted;
      if (!figures.some((f) => f.name === p.name)) figures.push(p);
    }
  }
  // Collapse only ordinary white space: the no-break spaces Intl puts in "1 234" and "4,3 %" must stay,
  // so that a number is never broken across lines and the text still holds each figure as formatted.
  return { id, kind, text: text.replace(/[ \t\r\n]+/g, ' ').replace(/^ | $/g, ''), figures };
}

function fig(name: string, value: number | string, unit: string, formatted: string): Figure {
  return { name, value, unit, formatted };
}

/** Everything a series' statements need to format numbers alike. */
class Words {
  constructor(
    readonly s: SeriesBrief,
    readonly locale: string,
  ) {}
  get freq(): Frequency {
    return this.s.frequency;
  }
  unit(): string {
    return this.s.unit ? ` ${this.s.unit}` : '';
  }
  amount(name: string, v: number): Figure {
    return fig(name, v, this.s.unit, formatNumber(v, this.locale));
  }
  signed(name: string, v: number): Figure {
    return fig(name, v, this.s.unit, formatSigned(v, this.locale));
  }
  percent(name: string, v: number, signed = true): Figure {
    return fig(name, v, '%', formatPercent(v, this.locale, signed));
  }
  points(name: string, v: number): Figure {
    return fig(name, v, 'percentage points', formatNumber(v, this.locale, 1));
  }
  /** "in" for months, quarters and weeks; "on" for days and hours (an hour prints as "5 March 2026 at 13:00"). */
  when(): string {
    return this.freq === 'daily' || this.freq === 'hourly' ? 'on' : 'in';
  }
  period(name: string, iso: string): Figure {
    const ordinal = ordinalOf(this.freq, Date.parse(iso.length === 10 ? `${iso}T00:00:00Z` : iso));
    return fig(name, iso, 'period', formatPeriod(this.freq, ordinal, this.locale));
  }
  count(name: string, n: number, noun = periodNoun(this.freq)): Figure {
    return fig(name, n, noun, countNoun(n, noun, this.locale));
  }
}

export function narrateSeries(s: SeriesBrief, locale: string): Statement[] {
  const w = new Words(s, locale);
  const out: Statement[] = [headline(w), context(w), seasonal(w)];
  for (let i = 0; i < s.analysis.comparisons.length; i++) out.push(comparison(w, i));
  out.push(unusual(w), firmness(w));
  const sens = sensitivity(w);
  if (sens) out.push(sens);
  return out;
}

/** The larger end (in size) of the 80% revision range: a change inside it is within what first estimates usually move. */
function revisionBand(s: SeriesBrief): number {
  const [lo, hi] = s.analysis.firmness.range80;
  return Math.max(Math.abs(lo), Math.abs(hi));
}

function headline(w: Words): Statement {
  const { s } = w;
  const yoy = s.analysis.trendYoY;
  const band = revisionBand(s);
  const name = s.label;
  if (Number.isNaN(yoy.percent)) {
    return statement('headline', 'headline', [
      `The trend of ${name} has no value a year ago or now, so its change cannot be given.`,
    ]);
  }
  const parts: Part[] = [];
  if (Number.isFinite(band) && Math.abs(yoy.percent) <= band) {
    parts.push(
      `The trend of ${name} is broadly unchanged on a year ago: `,
      w.percent('trendYoYPercent', yoy.percent),
      '. ',
    );
    parts.push(
      'That is inside the range by which first estimates usually move, up to ',
      w.points('revisionBand', band),
      ' points.',
    );
    return statement('headline', 'headline', parts);
  }
  const rising = yoy.change > 0;
  parts.push(
    `The trend of ${name} is ${rising ? 'up' : 'down'} `,
    w.percent('trendYoYPercent', Math.abs(yoy.percent), false),
  );
  parts.push(' on a year ago, a change of ', w.signed('trendYoYChange', yoy.change), `${w.unit()}.`);
  const j = judgement(rising ? 'rising' : 'falling', s.goodDirection);
  if (j === 'better') parts.push(' That is the direction you want.');
  if (j === 'worse') parts.push(' That is not the direction you want.');
  if (Number.isFinite(s.analysis.firmness.meanAbsoluteRevision)) {
    parts.push(
      ' First estimates like this one have moved by ',
      w.points('meanAbsoluteRevision', s.analysis.firmness.meanAbsoluteRevision),
      ' points on average.',
    );
  }
  return statement('headline', 'headline', parts);
}

function context(w: Words): Statement {
  const { s } = w;
  const r = s.reportingIndex;
  const obs = s.components.observed;
  const p = s.analysis.seasonalProfile;
  const parts: Part[] = [
    `${s.label} ${w.when()} `,
    w.period('reportingPeriod', s.reportingDate),
    ': ',
    w.amount('reportingValue', obs[r]),
    `${w.unit()}. `,
  ];
  if (Number.isNaN(p.latestRawChange)) {
    parts.push(`There is no value for the ${periodNoun(w.freq)} before, so the change cannot be given.`);
    return statement('context', 'context', parts);
  }
  parts.push(
    'That is ',
    w.signed('rawChange', p.latestRawChange),
    `${w.unit()} on `,
    w.period('previousPeriod', s.components.dates[r - 1]),
    '. ',
  );
  parts.push(
    `The usual pattern for this time of year gives `,
    w.signed('seasonalChange', p.latestSeasonalChange),
    `${w.unit()} of that. `,
  );
  parts.push(
    'The rest, ',
    w.signed('adjustedChange', p.latestRawChange - p.latestSeasonalChange),
    `${w.unit()}, is the change beyond the season.`,
  );
  return statement('context', 'context', parts);
}

function seasonal(w: Words): Statement {
  const p = w.s.analysis.seasonalProfile;
  const at = seasonPreposition(w.freq);
  // Season names are figures too: "Q3", "week 9" and "13:00" hold numbers a reader may check.
  return statement('seasonal', 'seasonal', [
    `Each ${cycleNoun(w.s)}, the seasonal peak is ${at} `,
    fig('peakSeason', p.peak.label, 'season', p.peak.label),
    ', about ',
    w.percent('peakPercent', Math.abs(p.peak.effectPercent), false),
    ` above the trend. The low point is ${at} `,
    fig('troughSeason', p.trough.label, 'season', p.trough.label),
    ', about ',
    w.percent('troughPercent', Math.abs(p.trough.effectPercent), false),
    ' below it.',
  ]);
}

/** "in January", "in Q1", "in week 9", "on Monday", "at 13:00". */
function seasonPreposition(f: Frequency): string {
  return f === 'daily' ? 'on' : f === 'hourly' ? 'at' : 'in';
}

/** The span one seasonal cycle covers, in words. */
function cycleNoun(s: SeriesBrief): string {
  const p = s.settings.period;
  if (s.frequency === 'daily' && p === 7) return 'week';
  if (s.frequency === 'hourly' && p === 24) return 'day';
  if (
    (s.frequency === 'monthly' && p === 12) ||
    (s.frequency === 'quarterly' && p === 4) ||
    (s.frequency === 'weekly' && p === 52)
  )
    return 'year';
  return 'cycle';
}

function comparison(w: Words, i: number): Statement {
  const c = w.s.analysis.comparisons[i];
  const what = c.aggregation === 'sum' ? 'total' : 'average';
  // The label is a figure too: "Last 12 months" or a custom label holds numbers a reader may check.
  const parts: Part[] = [
    fig(`${c.id}.label`, c.label, 'label', c.label),
    `: a ${what} of `,
    w.amount(`${c.id}.current`, c.raw.current),
    `${w.unit()}`,
  ];
  if (Number.isNaN(c.raw.percent)) {
    parts.push(', against ', w.amount(`${c.id}.baseline`, c.raw.baseline), `${w.unit()} a year before.`);
  } else {
    parts.push('. That is ', w.percent(`${c.id}.percent`, c.raw.percent), ' on the same span a year before (');
    parts.push(w.amount(`${c.id}.baseline`, c.raw.baseline), `${w.unit()}).`);
  }
  if (c.partial) parts.push(' It covers ', w.count(`${c.id}.periods`, c.current.periods), ' so far.');
  if (Number.isFinite(c.adjusted.percent)) {
    parts.push(' Without the season, the change is ', w.percent(`${c.id}.adjustedPercent`, c.adjusted.percent), '.');
  }
  return statement(`comparison-${c.id}`, 'comparison', parts);
}

function unusual(w: Words): Statement {
  const o = w.s.analysis.outliers;
  const noun = periodNoun(w.freq);
  if (o.length === 0) {
    return statement('unusual', 'unusual', [`No ${noun} in the last two years stands out from the usual pattern.`]);
  }
  const parts: Part[] = [
    w.count('unusualCount', o.length),
    ` in the last two years stood out from the usual pattern: `,
  ];
  const shown = o.slice(-3);
  shown.forEach((x, i) => {
    if (i > 0) parts.push(i === shown.length - 1 ? ' and ' : ', ');
    const mult = w.s.settings.model === 'multiplicative';
    parts.push(w.period(`unusual${i}.period`, x.date), ' (');
    if (mult) parts.push(w.percent(`unusual${i}.size`, 100 * (x.remainder - 1)));
    else parts.push(w.signed(`unusual${i}.size`, x.remainder), w.unit());
    parts.push(' against the expected value)');
  });
  parts.push('. These may be real events. The brief does not say why they happened.');
  return statement('unusual', 'unusual', parts);
}

function firmness(w: Words): Statement {
  const f = w.s.analysis.firmness;
  const parts: Part[] = [];
  if (f.provisionalCount > 0) {
    parts.push(
      'The last ',
      w.count('provisionalCount', f.provisionalCount, 'value'),
      ' of the trend are provisional. They will change as new data come in. ',
    );
  }
  if (f.periodsChecked > 0 && Number.isFinite(f.meanAbsoluteRevision)) {
    parts.push('We checked the last ', w.count('periodsChecked', f.periodsChecked), '. ');
    parts.push(
      'The first estimate of the yearly trend change later moved by ',
      w.points('firmnessMean', f.meanAbsoluteRevision),
      ' points on average. ',
    );
    parts.push(
      'Eight in ten moves were between ',
      w.points('range80Low', f.range80[0]),
      ' and ',
      w.points('range80High', f.range80[1]),
      ' points.',
    );
  } else {
    parts.push('There is not enough history to measure how much first estimates move.');
  }
  return statement('firmness', 'firmness', parts);
}

function sensitivity(w: Words): Statement | null {
  const x = w.s.analysis.sensitivity;
  if (x.side === 'none' || !Number.isFinite(x.reversalValue)) return null;
  const turn = x.direction === 'rising' ? 'turn down' : 'turn up';
  return statement('sensitivity', 'sensitivity', [
    `For the trend to ${turn}, `,
    w.period('nextPeriod', x.nextDate),
    ` would need to come in ${x.side} about `,
    w.amount('reversalValue', x.reversalValue),
    `${w.unit()}.`,
  ]);
}

/** The cautions every brief carries once. */
export function briefCautions(_meta: BriefMeta): Statement[] {
  return [
    statement('caution-provisional', 'caution', [
      'Figures near the end are provisional. They will be revised as new data come in.',
    ]),
    statement('caution-no-forecast', 'caution', ['This brief describes the past. It is not a forecast.']),
    statement('caution-unusual', 'caution', ['Unusual values may be real events, not errors in the data.']),
    statement('caution-regulator', 'caution', ['If a regulator sets a method for your filing, use that method.']),
  ];
}

export { countOf };
