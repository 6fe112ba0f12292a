/**
 * The state-space filter's WebAssembly kernel (src/model/kernel/state-space.as.ts) against the JavaScript it
 * was written from (stateSpaceScript, innovationsScript), bit for bit: both are the same IEEE double
 * operations in the same order with the host's logarithm, so any difference at all is a mistake in the copy.
 * The JavaScript itself is held to R's stats::arima by arima-reference.test.ts; since the filter now runs in
 * the kernel, those reference checks run through it too.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { expandArma } from '../../src/model/arma-polynomials.js';
import { differencingPolynomial } from '../../src/model/differencing.js';
import { innovationsOperator, innovationsScript } from '../../src/model/innovations-operator.js';
import { type StateSpaceResult, stateSpaceFilter, stateSpaceScript } from '../../src/model/state-space-filter.js';
import { stateSpaceKernel } from '../../src/model/state-space-kernel.js';

/** A seeded series with a trend, a season of period m, noise and gaps at the given places. */
function series(n: number, m: number, seed: number, gaps: number[] = []): Float64Array {
  let s = seed >>> 0 || 1;
  const random = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
  const y = Float64Array.from(
    { length: n },
    (_, t) => 500 + 1.5 * t + 40 * Math.sin((2 * Math.PI * t) / m) + 25 * (random() - 0.5),
  );
  for (const g of gaps) if (g < n) y[g] = Number.NaN;
  return y;
}

const bits = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
const f64 = (v: number) => bits(Float64Array.of(v));

function expectSameBits(a: StateSpaceResult, b: StateSpaceResult, label: string): void {
  expect(f64(a.ssq).equals(f64(b.ssq)), `${label}: ssq ${a.ssq} ${b.ssq}`).toBe(true);
  expect(f64(a.sumlog).equals(f64(b.sumlog)), `${label}: sumlog ${a.sumlog} ${b.sumlog}`).toBe(true);
  expect(a.count, `${label}: count`).toBe(b.count);
  for (const key of ['state', 'covariance', 'residuals'] as const) {
    expect(a[key].length, `${label}: ${key} length`).toBe(b[key].length);
    expect(bits(a[key]).equals(bits(b[key])), `${label}: ${key}`).toBe(true);
  }
}

interface Model {
  ar: number[];
  ma: number[];
  sar: number[];
  sma: number[];
  d: number;
  D: number;
  m: number;
}

function polynomials(model: Model) {
  const { phi, theta } = expandArma(
    Float64Array.from(model.ar),
    Float64Array.from(model.ma),
    Float64Array.from(model.sar),
    Float64Array.from(model.sma),
    model.m,
  );
  return { phi: phi.slice(), theta: theta.slice(), delta: differencingPolynomial(model.d, model.D, model.m) };
}

const FIXED: [string, Model, number, number[]][] = [
  ['random walk', { ar: [], ma: [], sar: [], sma: [], d: 1, D: 0, m: 1 }, 60, []],
  ['ARIMA(1,1,1)', { ar: [0.5], ma: [-0.3], sar: [], sma: [], d: 1, D: 0, m: 1 }, 120, [3, 40, 41]],
  ['airline', { ar: [], ma: [-0.4], sar: [], sma: [-0.6], d: 1, D: 1, m: 12 }, 144, []],
  ['airline with gaps', { ar: [], ma: [-0.4], sar: [], sma: [-0.6], d: 1, D: 1, m: 12 }, 144, [0, 13, 14, 100, 143]],
  ['(2,0,0)(1,1,0)[12]', { ar: [0.6, -0.2], ma: [], sar: [-0.4], sma: [], d: 0, D: 1, m: 12 }, 120, [50]],
  ['(1,1,2)(2,1,1)[12]', { ar: [0.3], ma: [0.2, -0.1], sar: [0.2, -0.3], sma: [-0.5], d: 1, D: 1, m: 12 }, 400, [7]],
  ['(0,2,1) quarterly', { ar: [], ma: [-0.7], sar: [], sma: [], d: 2, D: 0, m: 4 }, 80, [10, 11, 12]],
  ['(1,0,0)(0,1,1)[4]', { ar: [0.8], ma: [], sar: [], sma: [-0.3], d: 0, D: 1, m: 4 }, 40, []],
  ['ARMA(1,1), no differencing', { ar: [0.7], ma: [0.4], sar: [], sma: [], d: 0, D: 0, m: 1 }, 100, [5]],
];

describe('state-space filter kernel (WebAssembly)', () => {
  it('is built (npm run build compiles it into dist/model/state-space-kernel.wasm)', () => {
    expect(stateSpaceKernel(), 'no dist/model/state-space-kernel.wasm: run npm run build').not.toBeNull();
  });

  it('filters to the bits of the JavaScript on fixed models with differencing and gaps', () => {
    for (const [label, model, n, gaps] of FIXED) {
      const { phi, theta, delta } = polynomials(model);
      const y = series(n, model.m, n + gaps.length, gaps);
      expectSameBits(stateSpaceFilter(y, phi, theta, delta), stateSpaceScript(y, phi, theta, delta), label);
    }
  });

  it('gives the innovations operator of the JavaScript, columns of two operators interleaved', () => {
    for (const [label, model, n, gaps] of FIXED) {
      const { phi, theta, delta } = polynomials(model);
      const y = series(n, model.m, 7 * n, gaps);
      const missing = (t: number) => Number.isNaN(y[t]);
      const kernel = innovationsOperator(phi, theta, delta, missing, n);
      const script = innovationsScript(phi, theta, delta, missing, n);
      // Another operator (and a filter) in between: each call must still see its own gains.
      const other = innovationsOperator(Float64Array.of(0.5), new Float64Array(0), Float64Array.of(1), () => false, 30);
      const u = y.map((v) => (Number.isNaN(v) ? 0 : v - 500));
      expect(bits(kernel(u)).equals(bits(script(u))), `${label}: data`).toBe(true);
      const impulse = new Float64Array(n);
      for (const T of [0, 1, Math.floor(n / 2), n - 1]) {
        impulse[T] = 1;
        expect(bits(kernel(impulse, T)).equals(bits(script(impulse, T))), `${label}: one-off at ${T}`).toBe(true);
        other(series(30, 1, T));
        stateSpaceFilter(y, phi, theta, delta);
        expect(bits(kernel(impulse, T)).equals(bits(script(impulse, T))), `${label}: again at ${T}`).toBe(true);
        impulse[T] = 0;
      }
      // The operator's innovations are the filter's residuals (NaN there where the operator gives 0).
      const filtered = stateSpaceScript(
        y.map((v) => v - 500),
        phi,
        theta,
        delta,
      ).residuals;
      const e = kernel(u);
      for (let t = 0; t < n; t++) if (e[t] !== 0) expect(e[t]).toBeCloseTo(filtered[t], 12);
    }
  });

  it('filters to the bits of the JavaScript on random models, lengths and gaps', () => {
    const coef = fc.double({ min: -0.45, max: 0.45, noNaN: true });
    fc.assert(
      fc.property(
        fc.record({
          ar: fc.array(coef, { maxLength: 2 }),
          ma: fc.array(coef, { maxLength: 2 }),
          sar: fc.array(coef, { maxLength: 1 }),
          sma: fc.array(coef, { maxLength: 1 }),
          d: fc.integer({ min: 0, max: 2 }),
          D: fc.integer({ min: 0, max: 1 }),
          m: fc.constantFrom(4, 7, 12),
        }),
        fc.integer({ min: 30, max: 300 }),
        fc.integer({ min: 1, max: 2 ** 31 }),
        fc.array(fc.integer({ min: 0, max: 299 }), { maxLength: 6 }),
        (model, n, seed, gaps) => {
          const { phi, theta, delta } = polynomials(model);
          const y = series(n, model.m, seed, gaps);
          const label = JSON.stringify({ model, n, seed, gaps });
          expectSameBits(stateSpaceFilter(y, phi, theta, delta), stateSpaceScript(y, phi, theta, delta), label);
          const missing = (t: number) => Number.isNaN(y[t]);
          const u = y.map((v) => (Number.isNaN(v) ? 0 : v));
          const from = seed % n;
          const k = innovationsOperator(phi, theta, delta, missing, n);
          const s = innovationsScript(phi, theta, delta, missing, n);
          expect(bits(k(u)).equals(bits(s(u))), `${label}: innovations`).toBe(true);
          expect(bits(k(u, from)).equals(bits(s(u, from))), `${label}: innovations from ${from}`).toBe(true);
        },
      ),
      { numRuns: 200, seed: 20261203 },
    );
  });
});
