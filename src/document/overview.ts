/**
 * The overview: every series of the brief at a glance, one row each — its latest value, the trend's
 * direction and change over a year, the typical revision of first estimates, the unusual periods and a
 * sparkline of the trend over the last three calendar years. The words and numbers are the figures of each
 * series' overview statement (narrate/overview.ts), whose claims the verifier checks; nothing is worked out
 * here but the sparkline's drawing.
 */

import { sceneToSvg } from '../chart/scene-svg.js';
import { sparklineScene } from '../chart/scenes/sparkline.js';
import { formatNumber, withUnit } from '../narrate/format.js';
import type { Brief, Chart, Figure, SeriesBrief } from '../vocabulary/brief.js';
import { ordinalAt, startOf } from '../vocabulary/period-index.js';
import type { OverviewRow, SectionBlock } from './blocks.js';
import type { BriefView } from './view.js';
import { WORDS } from './words.js';

export function overviewSection(brief: Brief, view: BriefView): SectionBlock {
  const locale = brief.meta.locale;
  const rows = brief.series.map((s, i) => overviewRow(s, view.series[i].anchor, locale));
  // A note every row shares (the latest value's period, the unusual periods' span) is said once, in the
  // column's header, so each row takes one line.
  const headers: string[] = [...WORDS.overviewHeaders];
  const shared = (cell: number, head: (note: string) => string): void => {
    const notes = new Set(rows.map((r) => r.cells[cell].note));
    const [only] = notes;
    if (notes.size !== 1 || !only) return;
    headers[cell + 1] = head(only);
    for (const r of rows) r.cells[cell] = { ...r.cells[cell], note: '' };
  };
  shared(0, WORDS.overviewLatestIn);
  shared(3, WORDS.overviewUnusualIn);
  return {
    kind: 'section',
    name: 'overview',
    id: 'overview',
    labelledBy: 'overview-title',
    titled: true,
    outline: WORDS.overview,
    newPage: false,
    detail: false,
    blocks: [
      { kind: 'heading', level: 2, text: WORDS.overview, id: 'overview-title', unit: '' },
      { kind: 'note', text: WORDS.overviewNote },
      { kind: 'overview', headers, rows },
    ],
  };
}

function overviewRow(s: SeriesBrief, target: string, locale: string): OverviewRow {
  const st = s.statements.find((x) => x.kind === 'overview');
  const figure = (name: string): Figure | undefined => st?.figures.find((f) => f.name === name);
  const text = (name: string): string => figure(name)?.formatted ?? '';
  const unit = (formatted: string) => withUnit(formatted, s.unit, locale);
  const latest = figure('latest');
  const direction = text('direction');
  const change = text('trendChange');
  const revision = figure('revision');
  const unusual = figure('unusualCount');
  const firstUpper = (t: string) => t.charAt(0).toUpperCase() + t.slice(1);
  return {
    label: s.label,
    target,
    text: st?.text ?? '',
    cells: [
      { value: latest ? unit(latest.formatted) : WORDS.notAvailable, note: text('latestPeriod') },
      {
        value: direction
          ? firstUpper(direction) + (change ? ` ${figure('trendChange')?.unit === '%' ? change : unit(change)}` : '')
          : WORDS.notAvailable,
        // The column's header says "over a year".
        note: '',
      },
      {
        value: revision
          ? revision.unit === 'percentage points'
            ? `${revision.formatted} ${WORDS.points}`
            : unit(revision.formatted)
          : WORDS.notAvailable,
        note: '',
      },
      {
        value: unusual ? formatNumber(Number(unusual.value), locale, 0) : WORDS.notAvailable,
        note: text('unusualSpan'),
      },
    ],
    spark: sparkline(s),
  };
}

/** The trend from three calendar years before the reporting period to it. */
function sparkline(s: SeriesBrief): Chart | null {
  const { trend } = s.components;
  const r = s.reportingIndex;
  if (r < 1) return null;
  const startAt = (i: number) => startOf(s.frequency, ordinalAt(s.periodIndex, i));
  const end = new Date(startAt(r));
  end.setUTCFullYear(end.getUTCFullYear() - 3);
  const cutoff = end.getTime();
  let from = r;
  while (from > 0 && startAt(from - 1) >= cutoff) from--;
  const scene = sparklineScene(trend.slice(from, r + 1));
  const alt = WORDS.sparkAlt(s.label);
  return {
    id: 'sparkline',
    title: alt,
    alt,
    caption: '',
    svg: sceneToSvg(scene, { idPrefix: `${s.id}-sparkline`, title: alt, desc: alt }),
    width: scene.width,
    height: scene.height,
    scene,
  };
}
