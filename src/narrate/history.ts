/**
 * Statements from the record of earlier briefs: what the last brief said of the trend's yearly change and
 * what today's data give for the same period; the past values the source data changed since then; and, once
 * enough briefs were published, how far published first estimates have moved. Every number is a figure.
 */
import type { Figure, SeriesBrief, Statement } from '../brief/model.js';
import { countNoun, formatNumber, formatPercent, formatPeriod, ordinalOfIso } from './format.js';
import { statement } from './statements.js';
import { periodNoun } from './wording.js';

/** Source revisions named one by one; more are counted. */
const NAMED_REVISIONS = 3;

type Part = string | Figure;

export function narrateHistory(s: SeriesBrief, locale: string): Statement[] {
  const h = s.history;
  if (!h?.sinceLast) return [];
  const period = (name: string, iso: string): Figure => ({
    name,
    value: iso,
    unit: 'period',
    formatted: formatPeriod(s.frequency, ordinalOfIso(s.frequency, iso), locale),
  });
  const pct = (name: string, v: number): Figure => ({
    name,
    value: v,
    unit: '%',
    formatted: formatPercent(v, locale, true),
  });
  const amount = (name: string, v: number): Figure => ({
    name,
    value: v,
    unit: s.unit,
    formatted: formatNumber(v, locale),
  });
  const unit = s.unit ? ` ${s.unit}` : '';
  const out: Statement[] = [];
  const last = h.sinceLast;
  const lastPeriod = period('lastBriefPeriod', last.period);
  const now = period('reportingPeriod', s.reportingDate);
  if (!Number.isFinite(last.published)) {
    out.push(statement('since-last', 'history', ['The ', lastPeriod, ' brief gave no yearly change for the trend.']));
  } else {
    const parts: Part[] = [
      'In the ',
      lastPeriod,
      " brief, the trend's yearly change for ",
      lastPeriod,
      ' was ',
      pct('lastBriefTrendYoY', last.published),
      '. ',
    ];
    const published = formatPercent(last.published, locale, true);
    if (!Number.isFinite(last.now)) parts.push('With data to ', now, ', it can no longer be given.');
    else if (formatPercent(last.now, locale, true) === published) parts.push('With data to ', now, ', it is the same.');
    else parts.push('With data to ', now, ', it is now ', pct('lastPeriodTrendYoYNow', last.now), '.');
    out.push(statement('since-last', 'history', parts));
  }
  if (h.sourceRevisions.length > 0) {
    const noun = `earlier ${periodNoun(s.frequency)}`;
    const parts: Part[] = [
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
    const named = h.sourceRevisions.slice(-NAMED_REVISIONS).reverse();
    named.forEach((r, i) => {
      if (i > 0) parts.push(i === named.length - 1 && h.sourceRevisions.length <= NAMED_REVISIONS ? ' and ' : ', ');
      parts.push(period(`sourceRevision${i}.period`, r.date), ' from ');
      parts.push(
        Number.isNaN(r.before) ? 'no value' : amount(`sourceRevision${i}.before`, r.before),
        ' to ',
        Number.isNaN(r.after) ? 'no value' : amount(`sourceRevision${i}.after`, r.after),
        Number.isNaN(r.after) ? '' : unit,
      );
    });
    const more = h.sourceRevisions.length - named.length;
    if (more > 0)
      parts.push(
        ', and ',
        { name: 'sourceRevisionMore', value: more, unit: 'more', formatted: formatNumber(more, locale, 0) },
        ' more',
      );
    parts.push('.');
    out.push(statement('source-revisions', 'history', parts));
  }
  if (h.published) {
    const p = h.published;
    const points = (name: string, v: number): Figure => ({
      name,
      value: v,
      unit: 'percentage points',
      formatted: formatNumber(v, locale, 1),
    });
    out.push(
      statement('firmness-published', 'firmness', [
        'Across ',
        {
          name: 'publishedBriefs',
          value: p.revisions.length,
          unit: 'brief',
          formatted: countNoun(p.revisions.length, 'brief', locale),
        },
        ' already published, the first published yearly change of the trend has since moved by ',
        points('publishedMean', p.meanAbsoluteRevision),
        ' points on average. Eight in ten moves were between ',
        points('publishedRange80Low', p.range80[0]),
        ' and ',
        points('publishedRange80High', p.range80[1]),
        ' points.',
      ]),
    );
  }
  return out;
}
