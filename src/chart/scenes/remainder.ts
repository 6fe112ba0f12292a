/**
 * The remainder as stems from the centre line (0 for an additive model, 1 for a multiplicative one), with
 * unusual values (diagnostics.outliers) as larger diamonds in another colour, labelled with their period
 * where the labels do not crowd each other (remainder.ts's spreadLabels, with this plot's real width).
 */
import type { SeriesBrief } from '../../brief/model.js';
import { textWidth } from '../font-metrics.js';
import { formatPeriod } from '../format.js';
import { frame, PADDING } from '../frame.js';
import type { LegendEntry } from '../legend.js';
import type { ChartOptions } from '../options.js';
import { remainderCentre, spreadLabels, UNUSUAL, USUAL } from '../remainder.js';
import type { Mark, Scene, Stroke, TextMark } from '../scene.js';
import { LABEL_SIZE, PALETTE } from '../theme.js';

/** Marker areas in px², as the spec's point sizes. */
export const USUAL_SIZE = 14;
export const UNUSUAL_SIZE = 110;
/** Domain padding at both ends, px, for the labels over and under the extreme points. */
export const REMAINDER_PADDING = 18;
const LABEL_DY = 9;

export function remainderScene(series: SeriesBrief, options: ChartOptions): Scene {
  const { dates, remainder } = series.components;
  const centre = remainderCentre(series);
  const outliers = series.diagnostics.outliers.filter((o) => o.index >= 0 && o.index < dates.length);
  const unusual = new Set(outliers.map((o) => o.index));
  const times = dates.map((d) => Date.parse(d));
  const t0 = times.length > 0 ? times[0] : 0;
  const t1 = times.length > 0 ? times[times.length - 1] : 1;

  const entries: LegendEntry[] = [
    { label: USUAL, shape: 'circle', fill: PALETTE.remainder },
    ...(unusual.size > 0 ? [{ label: UNUSUAL, shape: 'diamond' as const, fill: PALETTE.unusual }] : []),
  ];
  const f = frame({
    legend: entries,
    values: [remainder],
    include: [centre],
    padding: REMAINDER_PADDING,
    axis: true,
    title: centre === 1 ? 'ratio to trend × season' : series.unit || null,
    grid: false,
    x: { kind: 'time', domain: t0 <= t1 ? [t0, t1] : [t1, t0] },
    locale: options.locale,
  });

  const stemStroke: Stroke = { colour: PALETTE.remainder, width: 1, opacity: 0.55 };
  const base = f.y(centre);
  const stems: Mark[] = [];
  const points: Mark[] = [];
  for (let i = 0; i < dates.length; i++) {
    const v = remainder[i];
    if (!Number.isFinite(v)) continue;
    const x = f.x(times[i]);
    const y = f.y(v);
    stems.push({ type: 'line', x1: x, y1: base, x2: x, y2: y, stroke: stemStroke });
    const odd = unusual.has(i);
    points.push({
      type: 'symbol',
      shape: odd ? 'diamond' : 'circle',
      x,
      y,
      size: odd ? UNUSUAL_SIZE : USUAL_SIZE,
      fill: odd ? PALETTE.unusual : PALETTE.remainder,
    });
  }

  const candidates = [...outliers]
    .sort((a, b) => Math.abs(b.score) - Math.abs(a.score) || a.index - b.index)
    .filter((o) => Number.isFinite(remainder[o.index]))
    .map((o) => ({
      index: o.index,
      value: remainder[o.index],
      text: formatPeriod(dates[o.index], series.frequency, options.locale),
    }));
  // Labels stay inside the figure: one near an end moves in rather than past the edge.
  const minX = PADDING - f.plotLeft;
  const maxX = f.plotWidth + 2;
  const label = (c: (typeof candidates)[number], above: boolean): TextMark => {
    const w = textWidth(c.text, LABEL_SIZE);
    const x = Math.min(Math.max(f.x(times[c.index]), minX + w / 2), maxX - w / 2);
    const y = f.y(c.value) + (above ? -LABEL_DY : LABEL_DY);
    return {
      type: 'text',
      x,
      y,
      text: c.text,
      anchor: 'middle',
      baseline: above ? 'bottom' : 'top',
      size: LABEL_SIZE,
      weight: 'normal',
      fill: PALETTE.ink,
    };
  };
  const above = spreadLabels(
    candidates.filter((c) => c.value >= centre),
    dates.length,
    f.plotWidth,
  ).map((c) => label(c, true));
  const below = spreadLabels(
    candidates.filter((c) => c.value < centre),
    dates.length,
    f.plotWidth,
  ).map((c) => label(c, false));

  const data: Mark[] = [
    {
      type: 'group',
      name: 'centre',
      x: 0,
      y: 0,
      marks: [
        {
          type: 'line',
          x1: 0,
          y1: base,
          x2: f.plotWidth,
          y2: base,
          stroke: { colour: PALETTE.ink, width: 1.25 },
        },
      ],
    },
    { type: 'group', name: 'stems', x: 0, y: 0, marks: stems },
    { type: 'group', name: 'points', x: 0, y: 0, marks: points },
  ];
  if (above.length > 0) data.push({ type: 'group', name: 'labels-above', x: 0, y: 0, marks: above });
  if (below.length > 0) data.push({ type: 'group', name: 'labels-below', x: 0, y: 0, marks: below });
  return f.scene(data);
}
