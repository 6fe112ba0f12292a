/**
 * The remainder as stems from the centre line (0 for an additive model, 1 for a multiplicative one), with
 * unusual values (diagnostics.outliers) as larger diamonds in another colour, labelled with their period
 * where the labels do not crowd each other (remainder.ts's spreadLabels, with this plot's real width).
 */
import type { SeriesBrief } from '../../vocabulary/brief.js';
import { ordinalAt } from '../../vocabulary/period-index.js';
import type { Mark, Scene, Stroke, TextMark } from '../../vocabulary/scene.js';
import { bucketise, denseUnit, instantsOf, UNIT_WORDS } from '../dense.js';
import { textWidth } from '../font-metrics.js';
import { formatPeriod } from '../format.js';
import { frame, PADDING } from '../frame.js';
import type { LegendEntry } from '../legend.js';
import type { ChartOptions } from '../options.js';
import { MAX_LABELS, remainderCentre, UNUSUAL, USUAL } from '../remainder.js';
import { LABEL_SIZE, PALETTE } from '../theme.js';

/** Marker areas in px², as the spec's point sizes. */
export const USUAL_SIZE = 14;
export const UNUSUAL_SIZE = 110;
/** Smaller diamonds over a dense series' range bars, where many may sit side by side. */
export const DENSE_UNUSUAL_SIZE = 50;
/** Labels a dense series' remainder chart keeps: its periods are long words ("7 August 2001 at 07:00"). */
const DENSE_MAX_LABELS = 4;
/** Domain padding at both ends, px, for the labels over and under the extreme points. */
export const REMAINDER_PADDING = 18;
const LABEL_DY = 9;
const LABEL_GAP = 6;
/** Opacity of a dense series' range bars. */
const RANGE_OPACITY = 0.45;

export function remainderScene(series: SeriesBrief, options: ChartOptions): Scene {
  const { dates, remainder } = series.components;
  const centre = remainderCentre(series);
  const outliers = series.diagnostics.outliers.filter((o) => o.index >= 0 && o.index < dates.length);
  const unusual = new Set(outliers.map((o) => o.index));
  const times = instantsOf(series.periodIndex);
  const t0 = times.length > 0 ? times[0] : 0;
  const t1 = times.length > 0 ? times[times.length - 1] : 1;
  const unit = denseUnit(series.frequency, times);
  const buckets = unit ? bucketise(times, remainder, unit) : null;

  const entries: LegendEntry[] = [
    buckets
      ? {
          label: `range in a ${UNIT_WORDS[buckets.unit].one}`,
          shape: 'square',
          fill: PALETTE.remainder,
          fillOpacity: RANGE_OPACITY,
        }
      : { label: USUAL, shape: 'circle', fill: PALETTE.remainder },
    ...(unusual.size > 0 ? [{ label: UNUSUAL, shape: 'diamond' as const, fill: PALETTE.unusual }] : []),
  ];
  const f = frame({
    legend: entries,
    values: buckets ? [buckets.min, buckets.max] : [remainder],
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
  const diamond = (i: number): Mark => ({
    type: 'symbol',
    shape: 'diamond',
    x: f.x(times[i]),
    y: f.y(remainder[i]),
    size: buckets ? DENSE_UNUSUAL_SIZE : UNUSUAL_SIZE,
    fill: PALETTE.unusual,
  });
  if (buckets) {
    // One bar a bucket from its lowest to its highest remainder, at least a hair tall; diamonds on top.
    for (let j = 0; j < buckets.start.length; j++) {
      if (buckets.count[j] === 0) continue;
      const x0 = f.x(buckets.start[j]);
      const x1 = f.x(buckets.end[j]);
      const top = f.y(Math.max(buckets.max[j], centre));
      const bottom = f.y(Math.min(buckets.min[j], centre));
      const w = Math.max(0.8, (x1 - x0) * 0.8);
      stems.push({
        type: 'rect',
        x: (x0 + x1) / 2 - w / 2,
        y: top,
        width: w,
        height: Math.max(0.5, bottom - top),
        fill: PALETTE.remainder,
        fillOpacity: RANGE_OPACITY,
      });
    }
    for (const o of outliers) if (Number.isFinite(remainder[o.index])) points.push(diamond(o.index));
  } else {
    for (let i = 0; i < dates.length; i++) {
      const v = remainder[i];
      if (!Number.isFinite(v)) continue;
      const x = f.x(times[i]);
      const y = f.y(v);
      stems.push({ type: 'line', x1: x, y1: base, x2: x, y2: y, stroke: stemStroke });
      if (unusual.has(i)) continue;
      points.push({ type: 'symbol', shape: 'circle', x, y, size: USUAL_SIZE, fill: PALETTE.remainder });
    }
    // Diamonds over the usual points, so none hides under a neighbour's dot.
    for (const i of [...unusual].sort((a, b) => a - b)) if (Number.isFinite(remainder[i])) points.push(diamond(i));
  }

  const candidates = [...outliers]
    .sort((a, b) => Math.abs(b.score) - Math.abs(a.score) || a.index - b.index)
    .filter((o) => Number.isFinite(remainder[o.index]))
    .map((o) => ({
      index: o.index,
      value: remainder[o.index],
      text: formatPeriod(ordinalAt(series.periodIndex, o.index), series.frequency, options.locale),
    }));
  // Labels stay inside the figure: one near an end moves in rather than past the edge. The overlap test
  // uses that final place, so a label moved in never lands on its neighbour.
  const minX = PADDING - f.plotLeft;
  const maxX = f.plotWidth + 2;
  const placeX = (c: (typeof candidates)[number]): number => {
    const w = textWidth(c.text, LABEL_SIZE);
    return Math.min(Math.max(f.x(times[c.index]), minX + w / 2), maxX - w / 2);
  };
  const label = (c: (typeof candidates)[number], above: boolean): TextMark => ({
    type: 'text',
    x: placeX(c),
    y: f.y(c.value) + (above ? -LABEL_DY : LABEL_DY),
    text: c.text,
    anchor: 'middle',
    baseline: above ? 'bottom' : 'top',
    size: LABEL_SIZE,
    weight: 'normal',
    fill: PALETTE.ink,
  });
  const most = buckets ? DENSE_MAX_LABELS : MAX_LABELS;
  const above = spreadLabels(
    candidates.filter((c) => c.value >= centre),
    placeX,
    most,
  ).map((c) => label(c, true));
  const below = spreadLabels(
    candidates.filter((c) => c.value < centre),
    placeX,
    most,
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

/**
 * Keeps the labels, largest score first, that do not overlap (with a gap) one already kept on the same side
 * of the centre line, up to `most`; `x` gives each label's centre as it will be drawn.
 */
export function spreadLabels<T extends { text: string }>(candidates: T[], x: (c: T) => number, most = MAX_LABELS): T[] {
  const kept: { item: T; left: number; right: number }[] = [];
  for (const item of candidates) {
    if (kept.length >= most) break;
    const half = textWidth(item.text, LABEL_SIZE) / 2 + LABEL_GAP / 2;
    const at = x(item);
    const left = at - half;
    const right = at + half;
    if (kept.some((k) => left < k.right && right > k.left)) continue;
    kept.push({ item, left, right });
  }
  return kept.map((k) => k.item);
}
