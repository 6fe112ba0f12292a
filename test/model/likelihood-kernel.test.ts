/**
 * The likelihood's WebAssembly kernel (src/model/kernel/likelihood.as.ts) against the JavaScript it was
 * written from (armaChandrasekharScript, armaLikelihoodRecordScript and the JavaScript reverse pass), bit for
 * bit: both are the same IEEE double operations in the same order with the same Math.log, so any difference
 * at all is a mistake in the copy. The JavaScript itself is held to R's stats::arima by the reference tests
 * of test/model and test/reference; since fitArima runs through the kernel, those checks run through it too.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../src/data/synthetic.js';
import { arFromUnconstrained } from '../../src/model/ar-transform.js';
import { armaChandrasekhar, armaChandrasekharScript } from '../../src/model/arma-chandrasekhar.js';
import {
  armaLikelihoodAdjoint,
  armaLikelihoodRecord,
  armaLikelihoodRecordScript,
  likelihoodGradientWork,
} from '../../src/model/arma-likelihood-gradient.js';
import { expandArma } from '../../src/model/arma-polynomials.js';
import { likelihoodKernel } from '../../src/model/likelihood-kernel.js';

const noise = (n: number, seed: number) => {
  const rand = mulberry32(seed);
  return Float64Array.from({ length: n }, () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand()));
};

/** Same bits, NaN matching NaN (a NaN's payload is not part of the arithmetic). */
const same = (a: number, b: number) => Object.is(a, b) || (Number.isNaN(a) && Number.isNaN(b));
const sameArray = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((v, i) => same(v, b[i]));

interface Outcome {
  value: number;
  ssq: number;
  sumlog: number;
  residuals: Float64Array;
  gPhi: Float64Array;
  gTheta: Float64Array;
  gX: Float64Array;
}

function run(x: Float64Array, phi: Float64Array, theta: Float64Array, kernel: boolean): Outcome {
  const n = x.length;
  const r = Math.max(phi.length, theta.length + 1);
  const residuals = new Float64Array(n);
  const sums = (kernel ? armaChandrasekhar : armaChandrasekharScript)(x, phi, theta, residuals);
  const ws = likelihoodGradientWork(n, r);
  const value = (kernel ? armaLikelihoodRecord : armaLikelihoodRecordScript)(x, phi, theta, ws);
  expect(ws.stamp !== 0, 'the record pass ran where asked').toBe(kernel);
  const gPhi = new Float64Array(phi.length);
  const gTheta = new Float64Array(theta.length);
  const gX = new Float64Array(n);
  if (Number.isFinite(value)) armaLikelihoodAdjoint(phi, theta, gPhi, gTheta, gX, ws);
  return { value, ssq: sums.ssq, sumlog: sums.sumlog, residuals, gPhi, gTheta, gX };
}

function expectSameBits(x: Float64Array, phi: Float64Array, theta: Float64Array, label: string): void {
  const a = run(x, phi, theta, true);
  const b = run(x, phi, theta, false);
  expect(same(a.value, b.value), `${label}: value ${a.value} ${b.value}`).toBe(true);
  expect(same(a.ssq, b.ssq), `${label}: ssq`).toBe(true);
  expect(same(a.sumlog, b.sumlog), `${label}: sumlog`).toBe(true);
  expect(sameArray(a.residuals, b.residuals), `${label}: residuals`).toBe(true);
  expect(sameArray(a.gPhi, b.gPhi), `${label}: ∂/∂φ`).toBe(true);
  expect(sameArray(a.gTheta, b.gTheta), `${label}: ∂/∂θ`).toBe(true);
  expect(sameArray(a.gX, b.gX), `${label}: ∂/∂x`).toBe(true);
}

const model = (ar: number[], ma: number[], sar: number[], sma: number[], period: number) =>
  expandArma(arFromUnconstrained(Float64Array.from(ar)), ma, arFromUnconstrained(Float64Array.from(sar)), sma, period);

describe('likelihood kernel (WebAssembly)', () => {
  it('is built (npm run build compiles it into dist/model/likelihood-kernel.wasm)', () => {
    expect(likelihoodKernel(), 'no dist/model/likelihood-kernel.wasm: run npm run build').not.toBeNull();
  });

  it('gives the bits of the JavaScript on fixed models: values, residuals and gradients', () => {
    const f64 = (v: number[]) => Float64Array.from(v);
    const cases: [string, Float64Array, Float64Array, number][] = [
      ['white noise', f64([]), f64([]), 120],
      ['white noise, one value', f64([]), f64([]), 1],
      ['pure AR(2)', f64([0.6, -0.2]), f64([]), 200],
      ['pure MA(2)', f64([]), f64([0.4, 0.3]), 90],
      ['AR root near the unit circle', f64([0.999]), f64([]), 300],
      ['MA root near the unit circle', f64([]), f64([-0.995]), 300],
      ['ARMA(1,1)', f64([0.5]), f64([0.3]), 60],
      // Not stationary: the step-down fails and the autocovariances are solved by elimination.
      ['explosive AR(1)', f64([1.2]), f64([]), 50],
      ['AR(2) with a root inside the unit circle, MA(1)', f64([0.5, 0.6]), f64([0.4]), 70],
      ['AR(3) with a unit root', f64([1, 0.2, -0.2]), f64([]), 40],
      // Not stationary, yet a finite value (found by a seeded search): the gradient's elimination path.
      ['explosive AR(1) against an MA(1)', f64([1.0943112425506116]), f64([-0.917681947723031]), 30],
      [
        'AR(3) outside the unit circle, MA(2)',
        f64([0.8587475553154946, -0.47007096335291865, 0.6851424962282181]),
        f64([-0.6232861591503024, -0.42749652229249474]),
        30,
      ],
    ];
    for (const [label, phi, theta, n] of cases) expectSameBits(noise(n, n + 3), phi, theta, label);
    const seasonal: [string, ReturnType<typeof model>, number][] = [
      ['(2,0,1)(1,0,1)12', model([0.7, -0.3], [0.4], [0.5], [-0.6], 12), 120],
      ['(1,0,1)(1,0,1)12, seasonal AR near 1', model([0.3], [0.2], [6], [-0.3], 12), 240],
      ['(0,0,1)(0,0,1)12, the airline errors', model([], [-0.4], [], [-0.6], 12), 131],
      ['(1,0,0)(2,0,0)12', model([0.5], [], [0.4, -0.2], [], 12), 400],
      ['(1,0,1)(1,0,1)4', model([0.9], [-0.5], [0.5], [0.4], 4), 80],
      ['(2,0,2)(1,0,1)12, r = 27', model([0.2, 0.1], [0.3, -0.2], [0.4], [0.3], 12), 36],
    ];
    for (const [label, { phi, theta }, n] of seasonal) expectSameBits(noise(n, n), phi, theta, label);
  });

  it('gives the bits of the JavaScript on random stationary models and lengths (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { maxLength: 3 }),
        fc.array(fc.double({ min: -0.99, max: 0.99, noNaN: true }), { maxLength: 3 }),
        fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { maxLength: 2 }),
        fc.array(fc.double({ min: -0.99, max: 0.99, noNaN: true }), { maxLength: 1 }),
        fc.constantFrom(4, 7, 12),
        fc.integer({ min: 1, max: 500 }),
        fc.integer({ min: 0, max: 10_000 }),
        (raw, ma, sraw, sma, period, n, seed) => {
          const { phi, theta } = model(raw, ma, sraw, sma, period);
          expectSameBits(noise(n, seed), phi, theta, `seed ${seed}`);
        },
      ),
      { numRuns: 300, seed: 20261203 },
    );
  });

  it('gives the bits of the JavaScript on random AR polynomials, stationary or not (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1.6, max: 1.6, noNaN: true }), { minLength: 1, maxLength: 4 }),
        fc.array(fc.double({ min: -1.2, max: 1.2, noNaN: true }), { maxLength: 2 }),
        fc.integer({ min: 1, max: 200 }),
        fc.integer({ min: 0, max: 10_000 }),
        (phi, theta, n, seed) => {
          expectSameBits(noise(n, seed), Float64Array.from(phi), Float64Array.from(theta), `seed ${seed}`);
        },
      ),
      { numRuns: 300, seed: 3 },
    );
  });

  it('keeps the record of the point just taken while value-only passes run in between', () => {
    const a = model([0.6], [0.3], [0.4], [-0.5], 12);
    const b = model([-0.2], [], [], [0.7], 12);
    const x = noise(150, 11);
    const ws = likelihoodGradientWork(150, 27);
    armaLikelihoodRecord(x, a.phi, a.theta, ws);
    armaChandrasekhar(noise(150, 12), b.phi, b.theta);
    const gPhi = new Float64Array(a.phi.length);
    const gTheta = new Float64Array(a.theta.length);
    const gX = new Float64Array(150);
    armaLikelihoodAdjoint(a.phi, a.theta, gPhi, gTheta, gX, ws);
    const ref = run(x, a.phi, a.theta, false);
    expect(sameArray(gPhi, ref.gPhi) && sameArray(gTheta, ref.gTheta) && sameArray(gX, ref.gX)).toBe(true);
  });

  it('refuses a reverse pass whose record another point has overwritten', () => {
    const a = model([0.6], [0.3], [], [], 12);
    const x = noise(50, 1);
    const ws = likelihoodGradientWork(50, 2);
    const other = likelihoodGradientWork(50, 2);
    armaLikelihoodRecord(x, a.phi, a.theta, ws);
    armaLikelihoodRecord(x, a.phi, a.theta, other);
    expect(() =>
      armaLikelihoodAdjoint(a.phi, a.theta, new Float64Array(1), new Float64Array(1), new Float64Array(50), ws),
    ).toThrow(/overwritten/);
  });
});
