/**
 * The trend's year-over-year change for the last 36 bars (yoy-bars.ts chooses them): rises filled, falls
 * outlined, either side of a marked zero line, and the stretch computed from the provisional trend on a
 * light band labelled "provisional" — inside the band at its top when no bar reaches there, else in the
 * legend row above the band's end, so the word never overprints a bar.
 */
import type { SeriesBrief } from '../../vocabulary/brief.js';
import { ordinalAt } from '../../vocabulary/period-index.js';
import type { Mark, RectMark, Scene, TextMark } from '../../vocabulary/scene.js';
import { textWidth } from '../font-metrics.js';
import { frame } from '../frame.js';
import { LEGEND_HEIGHT, LEGEND_OFFSET, type LegendEntry } from '../legend.js';
import { provisionalRange } from '../line-with-trend.js';
import type { ChartOptions } from '../options.js';
import { LABEL_SIZE, PALETTE } from '../theme.js';
import { FALL, NO_YOY_TEXT, periodBounds, RISE, yoyBarRows, yoyBars } from '../yoy-bars.js';

export const BAR_STROKE = 1.5;
export const BAND_OPACITY = 0.45;
const LEGEND_STROKE = 2;
const PROVISIONAL = 'provisional';

export function yoyBarsScene(series: SeriesBrief, options: ChartOptions): Scene {
  const bars = yoyBars(series);
  const rows = yoyBarRows(series, bars);
  const empty = rows.length === 0;
  const domain: [number, number] =
    bars.length > 0
      ? [
          periodBounds(series.frequency, bars[0].ordinal)[0],
          periodBounds(series.frequency, bars[bars.length - 1].ordinal)[1],
        ]
      : [0, 1];

  const entries: LegendEntry[] = [
    { label: RISE, shape: 'square', fill: PALETTE.rise, stroke: { colour: PALETTE.rise, width: LEGEND_STROKE } },
    { label: FALL, shape: 'square', fill: 'white', stroke: { colour: PALETTE.fall, width: LEGEND_STROKE } },
  ];
  const f = frame({
    legend: entries,
    values: [rows.map((r) => r.percent)],
    include: [0],
    ...(empty ? { fixed: [-1, 1] as [number, number] } : {}),
    axis: !empty,
    title: '% on a year earlier',
    signed: true,
    grid: !empty,
    x: {
      kind: 'time',
      domain,
      ...(bars.length > 0 ? { ticksTo: periodBounds(series.frequency, bars[bars.length - 1].ordinal)[0] } : {}),
    },
    locale: options.locale,
  });
  const zero = f.y(0);

  const bandMarks: Mark[] = [];
  const overlay: Mark[] = [];
  const provisional = provisionalRange(series);
  const bandStart = provisional ? Math.max(provisional.from, bars[0]?.index ?? 0) : Number.NaN;
  const boxes: RectMark[] = rows.map((r) => {
    const x0 = f.x(r.start);
    const x1 = f.x(r.end);
    const v = f.y(r.percent);
    const fall = r.percent < 0;
    return {
      type: 'rect',
      x: x0,
      y: Math.min(v, zero),
      width: x1 - x0,
      height: Math.abs(v - zero),
      fill: fall ? 'white' : PALETTE.rise,
      stroke: { colour: fall ? PALETTE.fall : PALETTE.rise, width: BAR_STROKE },
    };
  });
  if (provisional && bars.length > 0 && bandStart <= bars[bars.length - 1].index) {
    const x = f.x(periodBounds(series.frequency, ordinalAt(series.periodIndex, bandStart))[0]);
    bandMarks.push({
      type: 'rect',
      x,
      y: 0,
      width: f.plotWidth - x,
      height: f.plotHeight,
      fill: PALETTE.grid,
      fillOpacity: BAND_OPACITY,
    });
    const w = textWidth(PROVISIONAL, LABEL_SIZE);
    const label: TextMark = {
      type: 'text',
      x: x + 4,
      y: 2,
      text: PROVISIONAL,
      anchor: 'start',
      baseline: 'top',
      size: LABEL_SIZE,
      weight: 'normal',
      fill: PALETTE.ink,
    };
    // The label's box, a little taller than its type; any bar (or the zero line) inside it takes the place.
    const bottom = 2 + LABEL_SIZE + 3;
    const fits =
      x + 4 + w <= f.plotWidth &&
      zero > bottom &&
      !boxes.some((b) => b.x < x + 4 + w + 2 && b.x + b.width > x + 2 && b.y < bottom);
    if (fits) bandMarks.push(label);
    else
      overlay.push({
        type: 'group',
        name: 'provisional-label',
        x: f.plotLeft,
        y: f.plotTop,
        marks: [
          { ...label, x: f.plotWidth, y: -(LEGEND_OFFSET + LEGEND_HEIGHT / 2), anchor: 'end', baseline: 'middle' },
        ],
      });
  }

  const data: Mark[] = [
    { type: 'group', name: 'provisional-band', x: 0, y: 0, marks: bandMarks },
    { type: 'group', name: 'yoy', x: 0, y: 0, marks: boxes },
  ];
  if (empty)
    data.push({
      type: 'group',
      name: 'no-change-possible',
      x: 0,
      y: 0,
      marks: [
        {
          type: 'text',
          x: f.plotWidth / 2,
          y: f.plotHeight / 2 - 12,
          text: NO_YOY_TEXT,
          anchor: 'middle',
          baseline: 'middle',
          size: LABEL_SIZE,
          weight: 'normal',
          fill: PALETTE.ink,
        },
      ],
    });
  data.push({
    type: 'group',
    name: 'zero',
    x: 0,
    y: 0,
    marks: [{ type: 'line', x1: 0, y1: zero, x2: f.plotWidth, y2: zero, stroke: { colour: PALETTE.ink, width: 1.25 } }],
  });
  return f.scene(data, overlay);
}
