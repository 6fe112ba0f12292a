/**
 * The pieces behind the exact regression gradient of fitArima: several columns filtered with one set of
 * Chandrasekhar gains (arma-chandrasekhar-columns.ts) against the one-column filter, the gradient
 * (regression-gradient.ts) against central differences of the likelihood objective, and BFGS with exact
 * partial derivatives against BFGS by differences. The likelihood fits themselves are held to stats::arima
 * by arima-reference.test.ts (the Seatbelts law and the Nile's step, with regressors).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../src/data/synthetic.js';
import { arFromUnconstrained } from '../../src/model/ar-transform.js';
import { armaChandrasekhar } from '../../src/model/arma-chandrasekhar.js';
import { armaChandrasekharColumns } from '../../src/model/arma-chandrasekhar-columns.js';
import { expandArma } from '../../src/model/arma-polynomials.js';
import { bfgs } from '../../src/model/bfgs.js';
import { regressionGradient } from '../../src/model/regression-gradient.js';

const model = (raw: number[], ma: number[], sar: number[], sma: number[], period: number) =>
  expandArma(arFromUnconstrained(Float64Array.from(raw)), ma, arFromUnconstrained(Float64Array.from(sar)), sma, period);

const noise = (n: number, seed: number) => {
  const rand = mulberry32(seed);
  return Float64Array.from({ length: n }, () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand()));
};

describe('several columns through one set of Chandrasekhar gains', () => {
  it('each column equals the one-column filter: innovations to 1e-12 of their size, Σ log F to 1e-12 (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { maxLength: 2 }),
        fc.array(fc.double({ min: -0.95, max: 0.95, noNaN: true }), { maxLength: 2 }),
        fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { maxLength: 1 }),
        fc.array(fc.double({ min: -0.95, max: 0.95, noNaN: true }), { maxLength: 1 }),
        fc.integer({ min: 1, max: 60 }),
        fc.integer({ min: 0, max: 1000 }),
        (raw, ma, sar, sma, n, seed) => {
          const { phi, theta } = model(raw, ma, sar, sma, 4);
          const cols = [noise(n, seed), noise(n, seed + 1), noise(n, seed + 2)];
          const out = cols.map(() => new Float64Array(n));
          const sumlog = armaChandrasekharColumns(cols, phi, theta, out);
          return cols.every((x, c) => {
            const one = new Float64Array(n);
            const s = armaChandrasekhar(x, phi, theta, one);
            const worst = Math.max(...one.map((v, t) => Math.abs(v - out[c][t])));
            return (
              worst <= 1e-12 * Math.max(1, ...one.map(Math.abs)) &&
              Math.abs(s.sumlog - sumlog) <= 1e-12 * Math.max(1, Math.abs(sumlog))
            );
          });
        },
      ),
    );
  });
});

describe('the regression gradient', () => {
  it('equals central differences of the objective to 1e-6 relative (seasonal ARMA errors, three regressors)', () => {
    // Objective ½(log(Σṽ²/N) + Σ log F/N), as fitArima minimises it. Central differences with step 1e-5 have
    // an error of order h²·f‴ ≈ 1e-10 here, well inside the stated 1e-6.
    const n = 96;
    const { phi, theta } = model([0.6, -0.2], [0.4], [0.5], [-0.6], 12);
    const X = [
      Float64Array.from({ length: n }, (_, t) => t / n),
      noise(n, 11),
      Float64Array.from({ length: n }, (_, t) => (t >= 50 ? 1 : 0)),
    ];
    const y = noise(n, 5);
    const beta = [0.3, -0.2, 0.5];
    const u = (b: number[]) => Float64Array.from(y, (v, t) => v - b[0] * X[0][t] - b[1] * X[1][t] - b[2] * X[2][t]);
    const objective = (b: number[]) => {
      const s = armaChandrasekhar(u(b), phi, theta);
      return 0.5 * (Math.log(s.ssq / n) + s.sumlog / n);
    };
    const g = new Float64Array(3);
    expect(regressionGradient(u(beta), X, phi, theta, g)).toBe(true);
    const h = 1e-5;
    for (let j = 0; j < 3; j++) {
      const up = beta.map((b, i) => (i === j ? b + h : b));
      const down = beta.map((b, i) => (i === j ? b - h : b));
      const numeric = (objective(up) - objective(down)) / (2 * h);
      expect(Math.abs(g[j] - numeric)).toBeLessThanOrEqual(1e-6 * Math.abs(numeric) + 1e-12);
    }
  });

  it('is zero for white noise whose residual is orthogonal to the regressor (by hand: −(1·1 + (−1)·1)/2)', () => {
    const g = new Float64Array(1);
    regressionGradient(
      Float64Array.from([1, -1]),
      [Float64Array.from([1, 1])],
      new Float64Array(0),
      new Float64Array(0),
      g,
    );
    expect(g[0]).toBe(-0);
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
