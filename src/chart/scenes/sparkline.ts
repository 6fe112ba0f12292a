/**
 * A sparkline: one series as a small line with no axes or labels, its last value marked by a dot, for the
 * overview's rows. The vertical range is the values' own (a sparkline shows shape, not level); a gap breaks
 * the line. At most `MAX_POINTS` points are drawn: a longer run is thinned to every k-th value, keeping the
 * last, since the line is a few hundred pixels at most.
 */
import type { Mark, Scene } from '../../vocabulary/scene.js';
import { PALETTE } from '../theme.js';

export const SPARK_WIDTH = 120;
export const SPARK_HEIGHT = 28;
const MAX_POINTS = 240;
const PAD = 3;

export function sparklineScene(values: ArrayLike<number>, width = SPARK_WIDTH, height = SPARK_HEIGHT): Scene {
  const n = values.length;
  const step = Math.max(1, Math.ceil(n / MAX_POINTS));
  const picked: number[] = [];
  for (let i = (n - 1) % step; i < n; i += step) picked.push(i);
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const i of picked) {
    const v = values[i];
    if (Number.isFinite(v)) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  const marks: Mark[] = [];
  if (lo <= hi) {
    const span = hi - lo;
    const x = (k: number) =>
      PAD + (picked.length > 1 ? (k * (width - 2 * PAD)) / (picked.length - 1) : (width - 2 * PAD) / 2);
    const y = (v: number) => (span > 0 ? height - PAD - ((v - lo) * (height - 2 * PAD)) / span : height / 2);
    const segments: number[][] = [];
    let current: number[] = [];
    picked.forEach((i, k) => {
      const v = values[i];
      if (Number.isFinite(v)) current.push(x(k), y(v));
      else if (current.length > 0) {
        segments.push(current);
        current = [];
      }
    });
    if (current.length > 0) segments.push(current);
    marks.push({
      type: 'path',
      segments,
      stroke: { colour: PALETTE.trend, width: 1.5, cap: 'round', join: 'round' },
    });
    const last = picked[picked.length - 1];
    if (Number.isFinite(values[last]))
      marks.push({
        type: 'symbol',
        shape: 'circle',
        x: x(picked.length - 1),
        y: y(values[last]),
        size: 12,
        fill: PALETTE.trend,
      });
  }
  return { width, height, background: '#ffffff', marks };
}
