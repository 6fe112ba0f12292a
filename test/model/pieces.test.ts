/** Small worked examples for the pieces of the ARIMA engine; each check names where its value comes from. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arFromUnconstrained, unconstrainedFromAr } from '../../src/model/ar-transform.js';
import { armaAutocovariance } from '../../src/model/arma-autocovariance.js';
import { armaChandrasekhar } from '../../src/model/arma-chandrasekhar.js';
import { armaFilter } from '../../src/model/arma-filter.js';
import { expandArma } from '../../src/model/arma-polynomials.js';
import { bfgs } from '../../src/model/bfgs.js';
import { difference, differencingPolynomial } from '../../src/model/differencing.js';
import { armaInitialCovariance } from '../../src/model/initial-covariance.js';
import { kalmanForecast } from '../../src/model/kalman-forecast.js';
import { invertMa, polynomialRoots } from '../../src/model/ma-invert.js';
import { normalQuantile } from '../../src/model/normal-quantile.js';
import { isStable } from '../../src/model/stable.js';
import { stateSpaceFilter } from '../../src/model/state-space-filter.js';

describe('polynomials', () => {
  it('multiplies out seasonal AR and MA parts (by hand)', () => {
    // (1 − 0.5z)(1 − 0.3z⁴) = 1 − 0.5z − 0.3z⁴ + 0.15z⁵ → phi = [0.5, 0, 0, 0.3, −0.15]
    const { phi, theta } = expandArma([0.5], [0.4], [0.3], [0.2], 4);
    expect(Array.from(phi)).toEqual([0.5, 0, 0, 0.3, -0.15]);
    // (1 + 0.4z)(1 + 0.2z⁴) = 1 + 0.4z + 0.2z⁴ + 0.08z⁵
    expect(Array.from(theta).map((v) => Math.round(v * 1e12) / 1e12)).toEqual([0.4, 0, 0, 0.2, 0.08]);
  });
  it('differences (by hand)', () => {
    // (1 − B)(1 − B⁴) = 1 − B − B⁴ + B⁵ → x_t = x_{t−1} + x_{t−4} − x_{t−5} + …
    expect(Array.from(differencingPolynomial(1, 1, 4))).toEqual([1, 0, 0, 1, -1]);
    expect(Array.from(differencingPolynomial(2, 0, 1))).toEqual([2, -1]);
    expect(Array.from(difference([1, 4, 9, 16], differencingPolynomial(1, 0, 1)))).toEqual([3, 5, 7]);
    expect(Array.from(difference([1, 4, 9, 16], differencingPolynomial(2, 0, 1)))).toEqual([2, 2]);
  });
});

describe('stationarity and invertibility', () => {
  it('step-down test (roots by hand)', () => {
    expect(isStable([0.5])).toBe(true); // root 2
    expect(isStable([1.2])).toBe(false);
    expect(isStable([0.5], 2.5)).toBe(false); // root 2 is inside |z| = 2.5
    expect(isStable([1.1, -0.3])).toBe(true); // 1 − 1.1z + 0.3z²: roots 5/3 and 2
    expect(isStable([1.1, -0.1])).toBe(false); // roots ≈ 1.0 and 10: 1 − 1.1z + 0.1z² = (1 − z)(1 − 0.1z)
  });
  it('agrees with the smallest root found by Durand–Kerner (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1500, max: 1500 }), { minLength: 1, maxLength: 4 }), (ints) => {
        const a = ints.map((v) => v / 1000);
        if (a[a.length - 1] === 0) return true;
        const c = Float64Array.from([1, ...a.map((v) => -v)]);
        const { re, im } = polynomialRoots(c);
        let min = Infinity;
        for (let i = 0; i < re.length; i++) min = Math.min(min, Math.hypot(re[i], im[i]));
        if (Math.abs(min - 1) < 1e-6) return true;
        return isStable(a) === min > 1;
      }),
    );
  });
  it('inverts an MA polynomial (by hand)', () => {
    expect(Array.from(invertMa(Float64Array.from([2])))).toEqual([0.5]);
    // 1 + 2.5z + z² = (1 + 2z)(1 + 0.5z): root −0.5 inside → (1 + 0.5z)² = 1 + z + 0.25z²
    const inv = invertMa(Float64Array.from([2.5, 1]));
    expect(inv[0]).toBeCloseTo(1, 12);
    expect(inv[1]).toBeCloseTo(0.25, 12);
  });
  it('the stationary map round-trips (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: 1, maxLength: 5 }), (u) => {
        const ar = arFromUnconstrained(Float64Array.from(u));
        if (!isStable(ar)) return false;
        const back = unconstrainedFromAr(ar);
        return u.every((v, i) => Math.abs(back[i] - v) < 1e-6 * Math.max(1, Math.abs(v)) || Math.abs(v) > 2.5);
      }),
    );
  });
});

describe('autocovariances and the initial state', () => {
  it('AR(1): γ(k) = 0.5ᵏ/(1 − 0.25) (textbook formula)', () => {
    const g = armaAutocovariance(Float64Array.from([0.5]), new Float64Array(0), 2);
    expect(g[0]).toBeCloseTo(4 / 3, 14);
    expect(g[1]).toBeCloseTo(2 / 3, 14);
    expect(g[2]).toBeCloseTo(1 / 3, 14);
  });
  it('ARMA(2,1) autocorrelations equal R stats::ARMAacf(ar = c(0.5, 0.2), ma = 0.4)', () => {
    const g = armaAutocovariance(Float64Array.from([0.5, 0.2]), Float64Array.from([0.4]), 3);
    // R 4.x: 1, 0.8012048, 0.6006024, 0.4605422 (printed to 7 digits)
    expect(g[1] / g[0]).toBeCloseTo(0.8012048, 7);
    expect(g[2] / g[0]).toBeCloseTo(0.6006024, 7);
    expect(g[3] / g[0]).toBeCloseTo(0.4605422, 7);
  });
  it('the initial covariance solves P = TPT′ + RR′ (property of the stationary state)', () => {
    const phi = Float64Array.from([0.5, 0.2]);
    const theta = Float64Array.from([0.4, -0.3]);
    const P = armaInitialCovariance(phi, theta);
    const r = 3;
    const T = [
      [0.5, 1, 0],
      [0.2, 0, 1],
      [0, 0, 0],
    ];
    const R = [1, 0.4, -0.3];
    for (let i = 0; i < r; i++) {
      for (let j = 0; j < r; j++) {
        let v = R[i] * R[j];
        for (let k = 0; k < r; k++) for (let l = 0; l < r; l++) v += T[i][k] * P[k * r + l] * T[j][l];
        expect(v).toBeCloseTo(P[i * r + j], 12);
      }
    }
  });
});

describe('filters', () => {
  it('white noise: sums of squares (by hand)', () => {
    const s = armaFilter(Float64Array.from([1, 2]), new Float64Array(0), new Float64Array(0));
    expect(s).toEqual({ ssq: 5, sumlog: 0, count: 2 });
  });
  it('random walk with a diffuse start: the first value is left out, then the steps (by hand)', () => {
    const s = stateSpaceFilter(
      Float64Array.from([1, 3, 6]),
      new Float64Array(0),
      new Float64Array(0),
      Float64Array.from([1]),
    );
    expect(s.count).toBe(2);
    expect(s.ssq).toBeCloseTo(4 + 9, 4); // diffuse prior 1e6: differences 2 and 3, up to 1e-6 relative
  });
  it('AR(1) forecasts from a known state (by hand)', () => {
    const f = kalmanForecast(
      2,
      Float64Array.from([2]),
      Float64Array.from([0]),
      Float64Array.from([0.5]),
      new Float64Array(0),
      new Float64Array(0),
    );
    expect(Array.from(f.mean)).toEqual([1, 0.5]);
    expect(Array.from(f.variance)).toEqual([1, 1.25]);
  });
});

describe('normal quantile', () => {
  it('equals R qnorm (printed with %.17g)', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.9599639845400536, 15);
    expect(normalQuantile(0.9)).toBeCloseTo(1.2815515655446008, 15);
    expect(normalQuantile(1e-10)).toBeCloseTo(-6.3613409024040557, 13);
    expect(normalQuantile(0.3)).toBeCloseTo(-0.52440051270804067, 15);
    expect(normalQuantile(0.5)).toBe(0);
    expect(normalQuantile(1.2)).toBeNaN();
  });
});

describe('bfgs', () => {
  it('finds the minimum of a quadratic (by hand: (1, −2))', () => {
    const r = bfgs((p) => (p[0] - 1) ** 2 + 10 * (p[1] + 2) ** 2, Float64Array.from([0, 0]));
    expect(r.par[0]).toBeCloseTo(1, 5);
    expect(r.par[1]).toBeCloseTo(-2, 5);
    expect(r.converged).toBe(true);
  });
});

describe('Chandrasekhar recursions', () => {
  it('give the sums of the full Kalman filter (property, random ARMA models and series)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 0, maxLength: 3 }),
        fc.array(fc.double({ min: -0.9, max: 0.9, noNaN: true }), { minLength: 0, maxLength: 3 }),
        fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: 3, maxLength: 40 }),
        (raw, ma, xs) => {
          const phi = arFromUnconstrained(Float64Array.from(raw));
          const theta = Float64Array.from(ma);
          const x = Float64Array.from(xs);
          const a = armaFilter(x, phi, theta);
          const b = armaChandrasekhar(x, phi, theta);
          return (
            Math.abs(a.ssq - b.ssq) <= 1e-8 * Math.max(1, a.ssq) &&
            Math.abs(a.sumlog - b.sumlog) <= 1e-8 * Math.max(1, Math.abs(a.sumlog))
          );
        },
      ),
    );
  });
});
