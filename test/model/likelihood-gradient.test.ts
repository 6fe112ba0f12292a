/**
 * The exact gradient of the likelihood objective (arma-likelihood-gradient.ts) and of the maps behind it
 * (arma-coefficient-adjoint.ts) against central differences of the value itself (armaChandrasekhar,
 * expandArma, arFromUnconstrained). Central differences of step h have an error of order h²·f‴/6; with
 * h = 1e-5 that is about 1e-10 here, and rounding adds ε·f/h ≈ 1e-11: on the seasonal model below the worst
 * gap measured is 8.5e-10 of the gradient's size (tolerance 5e-9). The property test's random models reach
 * AR roots near the unit circle, where the differences themselves are poorer (worst measured 1.0e-7;
 * tolerance 1e-6). The gradient in x is that of the regression coefficients too (x = y − Xβ).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../src/data/synthetic.js';
import { arFromUnconstrained } from '../../src/model/ar-transform.js';
import { armaChandrasekhar } from '../../src/model/arma-chandrasekhar.js';
import { arFromUnconstrainedAdjoint, expandArmaAdjoint } from '../../src/model/arma-coefficient-adjoint.js';
import { armaLikelihoodGradient } from '../../src/model/arma-likelihood-gradient.js';
import { expandArma } from '../../src/model/arma-polynomials.js';
import { bfgs } from '../../src/model/bfgs.js';

const noise = (n: number, seed: number) => {
  const rand = mulberry32(seed);
  return Float64Array.from({ length: n }, () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand()));
};
const objective = (x: Float64Array, phi: Float64Array, theta: Float64Array) => {
  const s = armaChandrasekhar(x, phi, theta);
  return 0.5 * (Math.log(s.ssq / s.count) + s.sumlog / s.count);
};
const central = (f: (v: Float64Array) => number, at: Float64Array, h = 1e-5) =>
  Float64Array.from(at, (_, i) => {
    const up = Float64Array.from(at);
    const down = Float64Array.from(at);
    up[i] += h;
    down[i] -= h;
    return (f(up) - f(down)) / (2 * h);
  });
const worstGap = (a: Float64Array, b: Float64Array) => {
  let scale = 1e-3;
  for (const v of b) scale = Math.max(scale, Math.abs(v));
  let worst = 0;
  for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]) / scale);
  return worst;
};

describe('the exact likelihood gradient', () => {
  it('white noise by hand: ½ log(Σx²/n), ∂/∂x = x/Σx² → [0.2, 0.4] for x = [1, 2]', () => {
    const gx = new Float64Array(2);
    const v = armaLikelihoodGradient(
      Float64Array.from([1, 2]),
      new Float64Array(0),
      new Float64Array(0),
      new Float64Array(0),
      new Float64Array(0),
      gx,
    );
    expect(v).toBeCloseTo(0.5 * Math.log(5 / 2), 15);
    expect(gx[0]).toBeCloseTo(0.2, 15);
    expect(gx[1]).toBeCloseTo(0.4, 15);
  });

  it('equals central differences in phi, theta and x to 1e-7 (seasonal ARMA, period 12, n = 120)', () => {
    const n = 120;
    const { phi, theta } = expandArma(
      arFromUnconstrained(Float64Array.from([0.7, -0.3])),
      [0.4, 0.2],
      arFromUnconstrained(Float64Array.from([0.5])),
      [-0.6],
      12,
    );
    const x = noise(n, 7);
    const gp = new Float64Array(phi.length);
    const gt = new Float64Array(theta.length);
    const gx = new Float64Array(n);
    const value = armaLikelihoodGradient(x, phi, theta, gp, gt, gx);
    expect(Math.abs(value - objective(x, phi, theta))).toBeLessThanOrEqual(1e-14);
    expect(
      worstGap(
        gp,
        central((v) => objective(x, v, theta), phi),
      ),
    ).toBeLessThanOrEqual(5e-9);
    expect(
      worstGap(
        gt,
        central((v) => objective(x, phi, v), theta),
      ),
    ).toBeLessThanOrEqual(5e-9);
    expect(
      worstGap(
        gx,
        central((v) => objective(v, phi, theta), x),
      ),
    ).toBeLessThanOrEqual(5e-9);
  });

  it('equals central differences for random stationary models, short and long series (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1.5, max: 1.5, noNaN: true }), { maxLength: 3 }),
        fc.array(fc.double({ min: -0.9, max: 0.9, noNaN: true }), { maxLength: 3 }),
        fc.array(fc.double({ min: -1.2, max: 1.2, noNaN: true }), { maxLength: 1 }),
        fc.array(fc.double({ min: -0.9, max: 0.9, noNaN: true }), { maxLength: 1 }),
        fc.integer({ min: 2, max: 80 }),
        fc.integer({ min: 0, max: 1000 }),
        (raw, ma, sraw, sma, n, seed) => {
          const { phi, theta } = expandArma(
            arFromUnconstrained(Float64Array.from(raw)),
            ma,
            arFromUnconstrained(Float64Array.from(sraw)),
            sma,
            4,
          );
          const x = noise(n, seed);
          const gp = new Float64Array(phi.length);
          const gt = new Float64Array(theta.length);
          const gx = new Float64Array(n);
          armaLikelihoodGradient(x, phi, theta, gp, gt, gx);
          return (
            worstGap(
              gp,
              central((v) => objective(x, v, theta), phi),
            ) <= 1e-6 &&
            worstGap(
              gt,
              central((v) => objective(x, phi, v), theta),
            ) <= 1e-6 &&
            worstGap(
              gx,
              central((v) => objective(v, phi, theta), x),
            ) <= 1e-6
          );
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('adjoints of the coefficient maps', () => {
  it('expandArma: Jᵀ·ḡ equals central differences of ḡ·expandArma (to 1e-9)', () => {
    const ar = [0.5, -0.2];
    const ma = [0.3];
    const sar = [0.4];
    const sma = [-0.5, 0.1];
    const m = 4;
    const rand = mulberry32(3);
    const { phi, theta } = expandArma(ar, ma, sar, sma, m);
    const pb = Float64Array.from(phi, () => rand() - 0.5);
    const tb = Float64Array.from(theta, () => rand() - 0.5);
    const out = {
      ar: new Float64Array(2),
      ma: new Float64Array(1),
      sar: new Float64Array(1),
      sma: new Float64Array(2),
    };
    expandArmaAdjoint(ar, ma, sar, sma, m, pb, tb, out);
    const all = Float64Array.from([...ar, ...ma, ...sar, ...sma]);
    const dot = (v: Float64Array) => {
      const e = expandArma(v.subarray(0, 2), v.subarray(2, 3), v.subarray(3, 4), v.subarray(4, 6), m);
      let s = 0;
      for (let i = 0; i < e.phi.length; i++) s += pb[i] * e.phi[i];
      for (let i = 0; i < e.theta.length; i++) s += tb[i] * e.theta[i];
      return s;
    };
    const numeric = central(dot, all);
    expect(worstGap(Float64Array.from([...out.ar, ...out.ma, ...out.sar, ...out.sma]), numeric)).toBeLessThanOrEqual(
      1e-9,
    );
  });

  it('the AR map: Jᵀ·ḡ equals central differences (p = 1 to 4 and back, to 1e-9)', () => {
    const rand = mulberry32(9);
    // Down again after 4: the map's scratch, kept between calls, must not carry a larger p's values over.
    for (const p of [1, 2, 3, 4, 3, 2, 1]) {
      const raw = Float64Array.from({ length: p }, () => 2 * rand() - 1);
      const bar = Float64Array.from({ length: p }, () => rand() - 0.5);
      const exact = arFromUnconstrainedAdjoint(raw, bar);
      const numeric = central((v) => arFromUnconstrained(v).reduce((s, c, k) => s + c * bar[k], 0), raw);
      expect(worstGap(exact, numeric)).toBeLessThanOrEqual(1e-9);
    }
    expect(arFromUnconstrainedAdjoint([0], [1])[0]).toBe(1);
  });
});

describe('BFGS with exact partial derivatives', () => {
  it('reaches the minimum BFGS by differences reaches, with fewer evaluations', () => {
    // f(x, y, z) = (x − 1)² + 10(y + 2)² + (x·z − 3)² + z²; ∂f/∂z = 2x(x·z − 3) + 2z given exactly.
    const f = (v: Float64Array) => (v[0] - 1) ** 2 + 10 * (v[1] + 2) ** 2 + (v[0] * v[2] - 3) ** 2 + v[2] ** 2;
    const plain = bfgs(f, new Float64Array(3));
    const exact = bfgs(f, new Float64Array(3), {
      partial: {
        from: 2,
        at: (v, g) => {
          g[2] = 2 * v[0] * (v[0] * v[2] - 3) + 2 * v[2];
          return true;
        },
      },
    });
    for (let i = 0; i < 3; i++) expect(exact.par[i]).toBeCloseTo(plain.par[i], 5);
    expect(exact.evaluations).toBeLessThan(plain.evaluations);
  });
});
