/**
 * Automatic selection with regressors against forecast::auto.arima(x, xreg =) (fixture:
 * test/model/generate-xreg.R; each case names its data set): the differencing orders are tested on the
 * regression residuals, so the 1899 step in the Nile (Cobb 1978) or a planted step is not taken for a unit
 * root, while the same series without the regressor is differenced.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { autoArima } from '../../src/model/auto-arima.js';
import { regressionResiduals } from '../../src/model/regression-residuals.js';

interface Case {
  id: string;
  period: number;
  values: number[];
  xreg: number[][];
  d: number;
  D: number;
  dWithout: number;
  DWithout: number;
}
const fixture = JSON.parse(readFileSync(new URL('./fixtures/auto-arima-xreg.json', import.meta.url), 'utf8')) as {
  cases: Case[];
};

describe('autoArima with regressors: d and D as forecast::auto.arima chooses them', () => {
  for (const c of fixture.cases) {
    it(c.id, () => {
      const y = Float64Array.from(c.values);
      const xreg = c.xreg.map((col) => Float64Array.from(col));
      const withX = autoArima(y, c.period, { xreg });
      expect([withX.d, withX.D]).toEqual([c.d, c.D]);
      const without = autoArima(y, c.period);
      expect([without.d, without.D]).toEqual([c.dWithout, c.DWithout]);
    });
  }
  it('at least one case where the regressor changes d (else the test could not fail)', () => {
    expect(fixture.cases.some((c) => c.d !== c.dWithout)).toBe(true);
  });
});

describe('regressionResiduals', () => {
  it('removes a constant and a step (worked by hand: means 1.5 and 10.5)', () => {
    const r = regressionResiduals(Float64Array.from([1, 2, 10, 11]), [Float64Array.from([0, 0, 1, 1])]);
    expect(Array.from(r)).toEqual([-0.5, 0.5, -0.5, 0.5].map((v) => expect.closeTo(v, 12)));
  });
  it('drops a column collinear with the constant and keeps NaN where y is missing', () => {
    const r = regressionResiduals(Float64Array.from([1, Number.NaN, 3]), [Float64Array.from([2, 2, 2])]);
    expect(r[0]).toBeCloseTo(-1, 12);
    expect(Number.isNaN(r[1])).toBe(true);
    expect(r[2]).toBeCloseTo(1, 12);
  });
});
