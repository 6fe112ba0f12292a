/**
 * Statements from the record of earlier briefs: what the last brief said of the trend's change over a year
 * and what today's data give for the same period; the past values the source data changed since then; and,
 * once enough briefs were published, how far published first estimates have moved. Every number is a
 * figure, none carries a sign (direction is said in words), and each statement carries its claim.
 */

import type { Figure, SeriesBrief, Statement } from '../vocabulary/brief.js';
import type { PublishedFirmnessClaim, SinceLastBriefClaim, SourceRevisionsClaim } from '../vocabulary/claims.js';
import { ordinalAt, ordinalOfIso } from '../vocabulary/period-index.js';
import { countNoun, formatNumber, formatPercent, formatPeriod, unitAround } from './format.js';
import { type Part, statement } from './statement.js';
import { periodNoun } from './wording.js';

/** Source revisions named one by one; more are counted. */
export const NAMED_REVISIONS = 3;

export function narrateHistory(s: SeriesBrief, locale: string): Statement[] {
  const h = s.history;
  if (!h?.sinceLast) return [];
  const relative = s.changeExpression === 'relative';
  const { before, after } = unitAround(s.unit, locale);
  // The earlier briefs' periods come from the record as labels; today's are read from the period index.
  const period = (name: string, iso: string): Figure => ({
    name,
    value: iso,
    unit: 'period',
    formatted: formatPeriod(s.frequency, ordinalOfIso(s.frequency, iso), locale),
  });
  const amount = (name: string, v: number): Figure => ({
    name,
    value: v,
    unit: s.unit,
    formatted: formatNumber(v, locale),
  });
  /** "0.4% higher than a year before", "62 ML lower than…", "the same as a year before" (as rounded). */
  const change = (name: string, v: number): Part[] => {
    const size: Figure = relative
      ? { name, value: Math.abs(v), unit: '%', formatted: formatPercent(Math.abs(v), locale, false) }
      : { name, value: Math.abs(v), unit: s.unit, formatted: formatNumber(Math.abs(v), locale) };
    const zero = relative ? formatPercent(0, locale, false) : formatNumber(0, locale);
    if (size.formatted === zero) return ['the same as a year before'];
    return [relative ? '' : before, size, `${relative ? '' : after} ${v > 0 ? 'higher' : 'lower'} than a year before`];
  };
  const out: Statement[] = [];
  const last = h.sinceLast;
  const published = relative ? last.published : last.publishedChange;
  const now = relative ? last.now : last.nowChange;
  const lastPeriod = period('lastBriefPeriod', last.period);
  const claim: SinceLastBriefClaim = {
    kind: 'since-last-brief',
    period: last.period,
    expression: s.changeExpression,
    published,
    now,
  };
  const parts: Part[] = [];
  if (!Number.isFinite(published)) parts.push('The ', lastPeriod, ' brief gave no yearly change for the trend. ');
  else
    parts.push(
      'In the ',
      lastPeriod,
      ' brief, the trend for ',
      lastPeriod,
      ' was ',
      ...change('lastBriefTrendYoY', published),
      '. ',
    );
  const reporting: Figure = {
    name: 'reportingPeriod',
    value: s.reportingDate,
    unit: 'period',
    formatted: formatPeriod(s.frequency, ordinalAt(s.periodIndex, s.reportingIndex), locale),
  };
  if (!Number.isFinite(now)) parts.push('With data to ', reporting, ', that change cannot be given.');
  else parts.push('With data to ', reporting, ', it is ', ...change('lastPeriodTrendYoYNow', now), '.');
  out.push(statement('since-last', 'history', parts, [claim]));

  if (h.sourceRevisions.length > 0) {
    const noun = `earlier ${periodNoun(s.frequency)}`;
    const named = h.sourceRevisions.slice(-NAMED_REVISIONS).reverse();
    const revParts: Part[] = [
      'Since the ',
      lastPeriod,
      ' brief, the source data changed for ',
      {
        name: 'sourceRevisionCount',
        value: h.sourceRevisions.length,
        unit: noun,
        formatted: countNoun(h.sourceRevisions.length, noun, locale),
      },
      ': ',
    ];
    named.forEach((r, i) => {
      if (i > 0) revParts.push(i === named.length - 1 && h.sourceRevisions.length <= NAMED_REVISIONS ? ' and ' : ', ');
      revParts.push(period(`sourceRevision${i}.period`, r.date), ' from ');
      revParts.push(
        ...(Number.isNaN(r.before) ? ['no value'] : [before, amount(`sourceRevision${i}.before`, r.before)]),
        // The unit once, after the second value ("from 1,510 to 1,522 ML"); a currency sign before each.
        Number.isNaN(r.before) || Number.isNaN(r.after) || before === '' ? '' : after,
        ' to ',
        ...(Number.isNaN(r.after) ? ['no value'] : [before, amount(`sourceRevision${i}.after`, r.after), after]),
      );
    });
    const more = h.sourceRevisions.length - named.length;
    if (more > 0) {
      revParts.push(
        ', and ',
        { name: 'sourceRevisionMore', value: more, unit: 'more', formatted: formatNumber(more, locale, 0) },
        ' more',
      );
    }
    revParts.push('.');
    const revClaim: SourceRevisionsClaim = {
      kind: 'source-revisions',
      since: last.period,
      count: h.sourceRevisions.length,
      named: named.map((r) => ({ ...r })),
    };
    out.push(statement('source-revisions', 'history', revParts, [revClaim]));
  }

  if (h.published) {
    const p = h.published;
    const points = (name: string, v: number): Figure => ({
      name,
      value: Math.abs(v),
      unit: 'percentage points',
      formatted: formatNumber(Math.abs(v), locale, 1),
    });
    const bound = (name: string, v: number): Part[] =>
      v === 0 || formatNumber(Math.abs(v), locale, 1) === formatNumber(0, locale, 1)
        ? ['no change']
        : [points(name, v), ` points ${v > 0 ? 'up' : 'down'}`];
    const pubClaim: PublishedFirmnessClaim = {
      kind: 'published-firmness',
      briefs: p.revisions.length,
      revisions: p.revisions.map((r) => ({ date: r.date, first: r.first, latest: r.latest })),
      meanAbsoluteRevision: p.meanAbsoluteRevision,
      range: { low: p.range80[0], high: p.range80[1], share: 0.8 },
    };
    // A revision is today's estimate minus the first published, as in the simulated study: up is positive.
    out.push(
      statement(
        'firmness-published',
        'firmness',
        [
          'Across ',
          {
            name: 'publishedBriefs',
            value: p.revisions.length,
            unit: 'brief',
            formatted: countNoun(p.revisions.length, 'brief', locale),
          },
          ' already published, the yearly change of the trend as first published has since moved by ',
          points('publishedMean', p.meanAbsoluteRevision),
          ' points on average. Eight in ten moves were between ',
          ...bound('publishedRange80Low', p.range80[0]),
          ' and ',
          ...bound('publishedRange80High', p.range80[1]),
          '.',
        ],
        [pubClaim],
      ),
    );
  }
  return out;
}
