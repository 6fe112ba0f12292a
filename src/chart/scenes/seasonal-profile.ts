/** One bar per season, in the cycle's order: how far that season usually sits above or below the trend. */
import type { SeriesBrief } from '../../vocabulary/brief.js';
import type { LineMark, Mark, Scene } from '../../vocabulary/scene.js';
import { frame } from '../frame.js';
import type { ChartOptions } from '../options.js';
import { PALETTE } from '../theme.js';

export const ZERO_WIDTH = 1.25;

export function seasonalProfileScene(series: SeriesBrief, options: ChartOptions): Scene {
  const seasons = [...series.analysis.seasonalProfile.seasons].sort((a, b) => a.season - b.season);
  const effects = seasons.map((s) => s.effect);
  const f = frame({
    legend: null,
    values: [effects],
    include: [0],
    axis: true,
    title: series.unit || null,
    grid: true,
    x: { kind: 'band', labels: seasons.map((s) => s.label) },
    locale: options.locale,
  });
  const band = f.band!;
  const bars: Mark[] = [];
  const zero = f.y(0);
  seasons.forEach((s, i) => {
    if (!Number.isFinite(s.effect)) return;
    const v = f.y(s.effect);
    bars.push({
      type: 'rect',
      x: band.start(i),
      y: Math.min(v, zero),
      width: band.bandwidth,
      height: Math.abs(v - zero),
      fill: PALETTE.season,
    });
  });
  const rule: LineMark = {
    type: 'line',
    x1: 0,
    y1: zero,
    x2: f.plotWidth,
    y2: zero,
    stroke: { colour: PALETTE.ink, width: ZERO_WIDTH },
  };
  return f.scene([
    { type: 'group', name: 'seasons', x: 0, y: 0, marks: bars },
    { type: 'group', name: 'zero', x: 0, y: 0, marks: [rule] },
  ]);
}
