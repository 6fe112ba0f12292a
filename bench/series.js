/**
 * The benchmark's synthetic series: a slow trend with a bend, a twelve-step seasonal pattern whose
 * amplitude drifts, Gaussian noise and a spike every few hundred points, so robust STL has outliers to
 * down-weight. Seeded, so every run and every machine times the same numbers.
 * Random numbers from src/data/synthetic.ts (mulberry32, Box–Muller), through dist/.
 *
 *   syntheticSeries(1200, 7) → Float64Array of 1,200 values, the same on every call
 */

import { normal as gaussian, mulberry32 } from '../dist/data/synthetic.js';

export { mulberry32 };

/** n values of trend + seasonal + noise + spikes, rounded to 3 decimals so a CSV holds them exactly. */
export function syntheticSeries(n, seed = 20240917) {
  const uniform = mulberry32(seed);
  const normal = () => gaussian(uniform);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    // Trend in "years" of 12 points so every size looks like a monthly series, just longer.
    const years = i / 12;
    const trend = 100 + 0.8 * years + 15 * Math.sin(years / 40);
    const amplitude = 10 + 3 * Math.sin(years / 25);
    const season = amplitude * Math.sin((2 * Math.PI * (i % 12)) / 12) + 4 * Math.cos((4 * Math.PI * (i % 12)) / 12);
    let v = trend + season + 2 * normal();
    // About one point in 300 is a spike of 8 to 20 units, up or down.
    if (uniform() < 1 / 300) v += (uniform() < 0.5 ? -1 : 1) * (8 + 12 * uniform());
    out[i] = Math.round(v * 1000) / 1000;
  }
  return out;
}
