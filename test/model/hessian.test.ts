/**
 * The Hessian rule of R's optimHess and the Jacobian of the AR map, on functions small enough to check by
 * hand.
 */
import { describe, expect, it } from 'vitest';
import { arFromUnconstrained } from '../../src/model/ar-transform.js';
import { arJacobian } from '../../src/model/ar-transform-jacobian.js';
import { optimHessian } from '../../src/model/optim-hessian.js';

describe('optimHessian', () => {
  it('is exact on a quadratic: x² + 3xy has Hessian [[2, 3], [3, 0]]', () => {
    const H = optimHessian(([x, y]) => x * x + 3 * x * y, Float64Array.from([1, 1]));
    expect(Array.from(H)).toEqual([2, 3, 3, 0].map((v) => expect.closeTo(v, 8)));
  });
  it('differences of step 1e-3: exp″(0) comes out as (cosh 2h − 1)/(2h²) = 1 + h²/3 + …', () => {
    // Central gradient of step h, differenced centrally over h: (e^{2h} − 2 + e^{−2h})/(4h²).
    const h = 1e-3;
    const H = optimHessian(([x]) => Math.exp(x), Float64Array.from([0]));
    expect(H[0]).toBeCloseTo((Math.cosh(2 * h) - 1) / (2 * h * h), 9);
    expect(H[0] - 1).toBeGreaterThan(3e-7); // not the exact value 1: R's rule, kept on purpose
  });
  it('scales the gradient step by parscale (the quadratic stays exact)', () => {
    const H = optimHessian(([x, y]) => 5 * x * x + x * y, Float64Array.from([2, 100]), Float64Array.from([1, 50]));
    expect(Array.from(H)).toEqual([10, 1, 1, 0].map((v) => expect.closeTo(v, 6)));
  });
});

describe('arJacobian', () => {
  it('one coefficient: forward difference of tanh, (tanh(u + 1e-3) − tanh(u))/1e-3', () => {
    const u = 0.4;
    const J = arJacobian(Float64Array.from([u]));
    expect(J[0]).toBeCloseTo((Math.tanh(u + 1e-3) - Math.tanh(u)) / 1e-3, 12);
  });
  it('two coefficients: entry [i][j] is ∂φⱼ/∂uᵢ', () => {
    const u = Float64Array.from([0.3, -0.2]);
    const J = arJacobian(u);
    const base = arFromUnconstrained(u);
    const moved = arFromUnconstrained(Float64Array.from([0.3, -0.2 + 1e-3]));
    expect(J[1 * 2 + 0]).toBeCloseTo((moved[0] - base[0]) / 1e-3, 12);
    expect(J[1 * 2 + 1]).toBeCloseTo((moved[1] - base[1]) / 1e-3, 12);
  });
});
