/**
 * The ARIMA engine against R's stats::arima (method "ML") and predict() on open data sets that ship with R
 * (fixtures written by test/model/generate.R; each case names its data set). R's optimum is taken with
 * reltol = 1e-12 so that both sides report the likelihood's maximum. Cases with regressors (the seat-belt
 * law in Seatbelts, the 1899 step in Nile, one-offs) test the regression with ARIMA errors.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fitArima } from '../../src/model/fit-arima.js';
import { forecastArima } from '../../src/model/forecast-arima.js';

interface Case {
  id: string;
  dataset: string;
  values: (number | null)[];
  period: number;
  order: number[];
  seasonal: number[];
  mean: boolean;
  xreg: number[][];
  newxreg: number[][];
  names: string[];
  coef: number[];
  se: number[];
  loglik: number;
  aic: number;
  aicc: number;
  sigma2: number;
  loglikDefaultTol: number;
  horizon: number;
  forecast: number[];
  forecastSe: number[];
}

const fixture = JSON.parse(readFileSync(new URL('./fixtures/arima.json', import.meta.url), 'utf8')) as {
  cases: Case[];
};

function fitCase(c: Case, likelihood: 'exact' | 'diffuse') {
  const y = Float64Array.from(c.values, (v) => (v === null ? Number.NaN : v));
  const fit = fitArima(
    y,
    {
      p: c.order[0],
      d: c.order[1],
      q: c.order[2],
      P: c.seasonal[0],
      D: c.seasonal[1],
      Q: c.seasonal[2],
      period: c.period,
      mean: c.mean,
      xreg: c.xreg.length > 0 ? c.xreg.map((col) => Float64Array.from(col)) : undefined,
    },
    { likelihood, standardErrors: true },
  );
  const fc = forecastArima(fit, c.horizon, { xreg: c.newxreg.map((col) => Float64Array.from(col)) });
  return { y, fit, fc };
}

function range(y: Float64Array): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of y) if (!Number.isNaN(v)) [lo, hi] = [Math.min(lo, v), Math.max(hi, v)];
  return hi - lo;
}

describe('fitArima (likelihood "diffuse", as R computes it) against stats::arima (ML)', () => {
  for (const c of fixture.cases) {
    it(`${c.id} (${c.dataset})`, () => {
      const { y, fit, fc } = fitCase(c, 'diffuse');
      expect(fit.names.length).toBe(c.names.length);
      // Coefficients within 1e-4 relative (of the coefficient, or of 1 for coefficients below 1 in size).
      for (let i = 0; i < c.coef.length; i++) {
        expect(Math.abs(fit.coef[i] - c.coef[i])).toBeLessThanOrEqual(1e-4 * Math.max(1, Math.abs(c.coef[i])));
      }
      expect(Math.abs(fit.loglik - c.loglik)).toBeLessThanOrEqual(1e-4 * Math.abs(c.loglik));
      expect(Math.abs(fit.aic - c.aic)).toBeLessThanOrEqual(1e-4 * Math.abs(c.aic));
      expect(Math.abs(fit.aicc - c.aicc)).toBeLessThanOrEqual(1e-4 * Math.abs(c.aicc));
      expect(Math.abs(fit.sigma2 / c.sigma2 - 1)).toBeLessThanOrEqual(1e-4);
      // Standard errors within 1e-4 relative: the Hessian by R's optimHess rule on the search's scale, and
      // the AR map's Jacobian by R's forward differences (largest difference on these cases: 7e-5, Nile's ma1).
      for (let i = 0; i < c.se.length; i++) {
        expect(Math.abs(fit.se![i] / c.se[i] - 1)).toBeLessThanOrEqual(1e-4);
      }
      // Never a worse optimum than R's with its default tolerance.
      expect(fit.loglik).toBeGreaterThanOrEqual(c.loglikDefaultTol - 1e-6 * Math.abs(c.loglikDefaultTol));
      // Forecasts and their standard errors within 1e-4 of the series' range.
      const tol = 1e-4 * range(y);
      for (let h = 0; h < c.horizon; h++) {
        expect(Math.abs(fc.mean[h] - c.forecast[h])).toBeLessThanOrEqual(tol);
        expect(Math.abs(fc.se[h] - c.forecastSe[h])).toBeLessThanOrEqual(tol);
      }
    });
  }
});

// The default, exact likelihood of the differenced series differs from R's diffuse approximation by up to
// 3e-3 in the log-likelihood on these cases (about 1e-5 relative); coefficients and forecasts stay within
// the same bounds as above.
describe('fitArima (exact likelihood, the default) against stats::arima (ML)', () => {
  for (const c of fixture.cases) {
    it(`${c.id} (${c.dataset})`, () => {
      const { y, fit, fc } = fitCase(c, 'exact');
      for (let i = 0; i < c.coef.length; i++) {
        expect(Math.abs(fit.coef[i] - c.coef[i])).toBeLessThanOrEqual(1e-4 * Math.max(1, Math.abs(c.coef[i])));
      }
      expect(Math.abs(fit.loglik - c.loglik)).toBeLessThanOrEqual(1e-4 * Math.abs(c.loglik));
      expect(Math.abs(fit.aicc - c.aicc)).toBeLessThanOrEqual(1e-4 * Math.abs(c.aicc));
      const tol = 1e-4 * range(y);
      for (let h = 0; h < c.horizon; h++) {
        expect(Math.abs(fc.mean[h] - c.forecast[h])).toBeLessThanOrEqual(tol);
        expect(Math.abs(fc.se[h] - c.forecastSe[h])).toBeLessThanOrEqual(tol);
      }
    });
  }
});
