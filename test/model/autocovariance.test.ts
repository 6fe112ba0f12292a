/**
 * ARMA autocovariances (arma-autocovariance.ts), whose (p+1)-system is solved by the step-down in O(p²),
 * against R's stats::ARMAacf (fixture test/model/fixtures/arma-acf.json from test/model/generate-acf.R) and
 * against Gaussian elimination of the same system (solveDense). The step-down's adjoint (used by the exact
 * likelihood gradient) against the adjoint of the eliminated system: λ = A⁻ᵀḡ, d̄ = λ, φ̄ⱼ = Σₖ λₖ γ(|k − j|),
 * with Aᵀ solved by elimination.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arFromUnconstrained } from '../../src/model/ar-transform.js';
import { armaAutocovariance, solveDense, stepDownAdjoint, stepDownSolve } from '../../src/model/arma-autocovariance.js';

const fixture = JSON.parse(readFileSync(new URL('./fixtures/arma-acf.json', import.meta.url), 'utf8')) as {
  cases: { id: string[]; ar: number[]; ma: number[]; acf: number[] }[];
};

const dense = (phi: Float64Array, d: Float64Array) => {
  const p = phi.length;
  const m = p + 1;
  const A = new Float64Array(m * m);
  for (let k = 0; k < m; k++) {
    A[k * m + k] += 1;
    for (let j = 1; j <= p; j++) A[k * m + Math.abs(k - j)] -= phi[j - 1];
  }
  return solveDense(A, Float64Array.from(d), m);
};

describe('ARMA autocovariances', () => {
  it.each(fixture.cases.map((c) => [c.id[0], c] as const))(
    '%s: autocorrelations equal R stats::ARMAacf to 1e-12',
    (_, c) => {
      const lags = c.acf.length - 1;
      const g = armaAutocovariance(Float64Array.from(c.ar), Float64Array.from(c.ma), lags);
      for (let k = 0; k <= lags; k++) expect(Math.abs(g[k] / g[0] - c.acf[k])).toBeLessThanOrEqual(1e-12);
    },
  );

  it('by hand: AR(1) with φ = 0.5 gives γ = 4/3 · 0.5ᵏ; MA(1) with θ = 0.5 gives [1.25, 0.5]', () => {
    const ar = armaAutocovariance(Float64Array.from([0.5]), new Float64Array(0), 2);
    expect([...ar].map((v) => v * 0.75)).toEqual([1, 0.5, 0.25]);
    expect([...armaAutocovariance(new Float64Array(0), Float64Array.from([0.5]), 1)]).toEqual([1.25, 0.5]);
  });

  // Both solutions' error is of order ε·cond, and the condition grows like the size of γ itself (roots near
  // the unit circle make both large): measured over 20000 random models, |Δγ| ≤ 3.7e-13·max|γ|²; stated
  // tolerance 1e-12·max(1, max|γ|)².
  it('the step-down equals Gaussian elimination to 1e-12·max|γ|² for stationary AR(1…14) (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -2.5, max: 2.5, noNaN: true }), { minLength: 1, maxLength: 14 }),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 15, maxLength: 15 }),
        (raw, rhs) => {
          const phi = arFromUnconstrained(Float64Array.from(raw));
          // c₀ = Σ θ̃ⱼψⱼ is 1 for a pure AR; the rest of the right-hand side is free.
          const d = Float64Array.from([1, ...rhs.slice(1, phi.length + 1)]);
          const want = dense(phi, d);
          const got = new Float64Array(phi.length + 1);
          if (!stepDownSolve(phi, Float64Array.from(d), new Float64Array((phi.length + 1) ** 2), got)) return false;
          const scale = Math.max(1, ...want.map(Math.abs));
          return got.every((v, k) => Math.abs(v - want[k]) <= 1e-12 * scale * scale);
        },
      ),
      { numRuns: 200 },
    );
  });

  // Errors of order ε·cond again, times the size of λ: measured over 20000 random models, |Δ| ≤
  // 1.5e-12·max(1, max|λ|)·max(1, max|γ|)²; stated tolerance 1e-11 of that scale.
  it('the step-down adjoint equals the eliminated system adjoint (d̄ and φ̄) for stationary AR(1…14) (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -2.5, max: 2.5, noNaN: true }), { minLength: 1, maxLength: 14 }),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 15, maxLength: 15 }),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 15, maxLength: 15 }),
        (raw, rhs, bar) => {
          const phi = arFromUnconstrained(Float64Array.from(raw));
          const p = phi.length;
          const m = p + 1;
          const d = Float64Array.from([1, ...rhs.slice(1, m)]);
          const gBar = Float64Array.from(bar.slice(0, m));
          const rows = new Float64Array(m * m);
          const levels = new Float64Array(m * m);
          const gamma = new Float64Array(m);
          if (!stepDownSolve(phi, Float64Array.from(d), rows, gamma, levels)) return false;
          const dBar = new Float64Array(m);
          const phiBar = new Float64Array(p);
          stepDownAdjoint(phi, rows, levels, gamma, Float64Array.from(gBar), dBar, phiBar, new Float64Array(m * m));
          // Aᵀλ = ḡ by elimination.
          const At = new Float64Array(m * m);
          for (let k = 0; k < m; k++) {
            At[k * m + k] += 1;
            for (let j = 1; j <= p; j++) At[Math.abs(k - j) * m + k] -= phi[j - 1];
          }
          const lambda = solveDense(At, Float64Array.from(gBar), m);
          const wantPhi = Float64Array.from({ length: p }, (_, i) => {
            let s = 0;
            for (let k = 0; k < m; k++) s += lambda[k] * gamma[Math.abs(k - (i + 1))];
            return s;
          });
          const scale = Math.max(1, ...lambda.map(Math.abs)) * Math.max(1, ...gamma.map(Math.abs)) ** 2;
          return (
            dBar.every((v, k) => Math.abs(v - lambda[k]) <= 1e-11 * scale) &&
            phiBar.every((v, k) => Math.abs(v - wantPhi[k]) <= 1e-11 * scale)
          );
        },
      ),
      { numRuns: 200 },
    );
  });

  it('reports a non-stationary polynomial (φ = [1.2]) instead of solving, and armaAutocovariance falls back', () => {
    const got = new Float64Array(2);
    expect(stepDownSolve(Float64Array.from([1.2]), Float64Array.from([1, 0]), new Float64Array(4), got)).toBe(false);
    const g = armaAutocovariance(Float64Array.from([1.2]), new Float64Array(0), 1);
    const want = dense(Float64Array.from([1.2]), Float64Array.from([1, 0]));
    expect(g[0]).toBeCloseTo(want[0], 12);
    expect(g[1]).toBeCloseTo(want[1], 12);
  });
});
