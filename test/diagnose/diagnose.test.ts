/**
 * Diagnostics on worked examples small enough to check by hand (arithmetic beside each value) and on
 * constructed series whose answer is known by design.
 */
import { describe, expect, it } from 'vitest';
import { mulberry32, normal } from '../../src/data/synthetic.js';
import { chooseModel } from '../../src/diagnose/model-choice.js';
import { remainderOutliers } from '../../src/diagnose/outliers.js';
import { residualSeasonality } from '../../src/diagnose/residual-seasonality.js';
import { robustScale } from '../../src/diagnose/robust-scale.js';
import { componentStrength } from '../../src/diagnose/strength.js';

describe('remainder outliers: beyond median ± 3 × 1.4826 × MAD (common practice)', () => {
  it('flags the one value far out', () => {
    // remainder [0, 1, −1, 0, 12, 0, 1, −1]: median 0; |r| = 0,1,1,0,12,0,1,1 → MAD = median = 1 (sorted
    // 0,0,0,1,1,1,1,12 → (1+1)/2), scale 1.4826; 12/1.4826 = 8.094 > 3; 1/1.4826 = 0.67 is not.
    const out = remainderOutliers([0, 1, -1, 0, 12, 0, 1, -1], false);
    expect(out).toHaveLength(1);
    expect(out[0].index).toBe(4);
    expect(out[0].score).toBeCloseTo(12 / 1.4826, 10);
  });
  it('judges multiplicative remainders on logs, so halving and doubling count alike', () => {
    const r = [1, 1.01, 0.99, 1, 2, 1, 0.5, 1.01, 0.99, 1];
    const out = remainderOutliers(r, true);
    expect(out.map((o) => o.index)).toEqual([4, 6]);
    expect(out[0].score).toBeCloseTo(-out[1].score, 10);
  });
  it('never flags NaN and returns nothing when the spread is zero', () => {
    expect(remainderOutliers([0, 0, 0, Number.NaN, 0], false)).toEqual([]);
  });
  it('robustScale: median 3 and MAD 1 × 1.4826 for [1, 2, 3, 4, 100]', () => {
    // |x − 3| = 2, 1, 0, 1, 97 → sorted 0, 1, 1, 2, 97 → median 1.
    expect(robustScale([1, 2, 3, 4, 100])).toEqual({ median: 3, mad: 1.4826 });
  });
});

describe('strength of trend and seasonality (Wang, Smith & Hyndman 2006; FPP 3rd ed. §4.3)', () => {
  it('worked example', () => {
    // T = [1,2,3,4], R = [0.1,−0.1,0.1,−0.1]: T+R = [1.1,1.9,3.1,3.9], mean 2.5, squares
    // 1.96+0.36+0.36+1.96 = 4.64 → Var = 4.64/3 = 1.5467; Var(R) = 0.04/3 = 0.013333 → 1 − 0.013333/1.5467 = 0.99138.
    expect(componentStrength([1, 2, 3, 4], [0.1, -0.1, 0.1, -0.1])).toBeCloseTo(1 - 0.04 / 4.64, 12);
  });
  it('is 0 when the remainder dominates and skips undefined points', () => {
    expect(componentStrength([0, 0, 0, 0], [1, -1, 1, -1])).toBe(0);
    expect(componentStrength([Number.NaN, 1, 2, 3, 4], [5, 0.1, -0.1, 0.1, -0.1])).toBeCloseTo(1 - 0.04 / 4.64, 12);
  });
});

describe('residual seasonality: F-test on the adjusted series by season', () => {
  it('worked example: one-way ANOVA of the first differences by season', () => {
    // adjusted [0, 1, 0, 1, 0, 1, 0, 1, 0], period 2: differences from t = 1: +1, −1, +1, −1, +1, −1, +1, −1.
    // t = 1,3,5,7 (season 1) all +1; t = 2,4,6,8 (season 0) all −1: within = 0 → F infinite, p = 0.
    const r = residualSeasonality([0, 1, 0, 1, 0, 1, 0, 1, 0], 2);
    expect(r.statistic).toBe(Number.POSITIVE_INFINITY);
    expect(r.pValue).toBe(0);
    expect(r.present).toBe(true);
    expect([r.df1, r.df2]).toEqual([1, 6]);
  });
  it('finds a pattern left in, and none in noise', () => {
    const rand = mulberry32(7);
    const noise = Array.from({ length: 120 }, () => normal(rand));
    const left = noise.map((v, i) => v + 3 * Math.sin((2 * Math.PI * i) / 12));
    expect(residualSeasonality(noise, 12).present).toBe(false);
    expect(residualSeasonality(left, 12).present).toBe(true);
  });
});

describe('automatic model choice', () => {
  const build = (level: (t: number) => number, swing: (lvl: number) => number): Float64Array =>
    Float64Array.from({ length: 96 }, (_, t) => level(t) + swing(level(t)) * Math.sin((2 * Math.PI * t) / 12));
  it('zero or negative values force additive', () => {
    const c = chooseModel(Float64Array.from([1, 2, 0, 4, 5, 6, 7, 8]), 2);
    expect(c.model).toBe('additive');
    expect(c.reason).toMatch(/zero or negative/);
  });
  it('a swing proportional to the level gives multiplicative (elasticity about 1)', () => {
    const c = chooseModel(
      build(
        (t) => 100 * 1.02 ** t,
        (l) => 0.3 * l,
      ),
      12,
    );
    expect(c.model).toBe('multiplicative');
    expect(c.elasticity).toBeGreaterThan(0.9);
    expect(c.reason).toMatch(/grows with the level/);
  });
  it('a swing of constant size gives additive (elasticity about 0)', () => {
    const c = chooseModel(
      build(
        (t) => 100 + 3 * t,
        () => 20,
      ),
      12,
    );
    expect(c.model).toBe('additive');
    expect(Math.abs(c.elasticity)).toBeLessThan(0.2);
  });
  it('a level that barely moves cannot tell the models apart: additive', () => {
    const c = chooseModel(
      build(
        (t) => 100 + 0.01 * t,
        (l) => 0.3 * l,
      ),
      12,
    );
    expect(c.model).toBe('additive');
    expect(c.reason).toMatch(/changed too little/);
  });
  it('fewer than three complete years: additive', () => {
    const c = chooseModel(
      build(
        (t) => 100 * 1.05 ** t,
        (l) => 0.3 * l,
      ).slice(0, 30),
      12,
    );
    expect(c.model).toBe('additive');
    expect(c.reason).toMatch(/fewer than three complete years/);
  });
});
