/**
 * A seeded generator of monthly series with planted outliers, for the detector's test (our own scenario,
 * no real data): y = 50 + 5·sin(2πt/12) + u, u an AR(1) with φ = 0.5 and unit innovations, and in each
 * series two events of a random type (AO, LS, TC with δ = 0.7) and sign, of size 4 to 6 standard
 * deviations of u, at least a year apart and a year from either end. Random numbers: mulberry32 (Tommy
 * Ettinger's public-domain generator, src/data/synthetic.ts), normals by Box–Muller.
 */
import { mulberry32 } from '../../src/data/synthetic.js';
import { outlierColumn } from '../../src/model/outlier-effects.js';

export interface Planted {
  type: 'AO' | 'LS' | 'TC';
  at: number;
  size: number;
}

export function simulateSeries(seed: number, n = 120): { values: Float64Array; planted: Planted[]; sdU: number } {
  const rand = mulberry32(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
  const phi = 0.5;
  const sdU = 1 / Math.sqrt(1 - phi * phi);
  const values = new Float64Array(n);
  let u = normal() * sdU;
  for (let t = 0; t < n; t++) {
    if (t > 0) u = phi * u + normal();
    values[t] = 50 + 5 * Math.sin((2 * Math.PI * t) / 12) + u;
  }
  const planted: Planted[] = [];
  const types = ['AO', 'LS', 'TC'] as const;
  while (planted.length < 2) {
    const at = 12 + Math.floor(rand() * (n - 24));
    if (planted.some((p) => Math.abs(p.at - at) < 12)) continue;
    const type = types[Math.floor(rand() * 3)];
    const size = (rand() < 0.5 ? -1 : 1) * (4 + 2 * rand()) * sdU;
    planted.push({ type, at, size });
    const col = outlierColumn(type, at, n, { rate: 0.7 });
    for (let t = 0; t < n; t++) values[t] += size * col[t];
  }
  return { values, planted, sdU };
}
