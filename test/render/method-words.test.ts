/**
 * The method appendix says how a multiplicative model is fitted: STL and MSTL work on the logarithms of the
 * data (decompose/index.ts; Cleveland et al. 1990, §3.6), so adjusted yearly totals need not equal the raw
 * ones. Found: a reviewer saw "year to date +8.0%, without the season +11.1%" with no word on why.
 */
import { describe, expect, test } from 'vitest';
import { seriesView } from '../../src/document/view.js';
import { exampleBriefs } from '../narrate/examples.js';

describe('the model row of the method appendix', async () => {
  const briefs = await exampleBriefs();
  test.each(briefs.flatMap((b) => b.brief.series.map((s) => [`${b.example} ${s.group ?? ''}`, s] as const)))(
    '%s',
    (_name, s) => {
      const row = seriesView(s, 'en-GB').method.rows.find((r) => r[0] === 'Model');
      if (s.settings.model === 'multiplicative') {
        expect(row?.[1]).toContain(s.settings.method === 'classical' ? 'ratios to a moving average' : 'on logarithms');
        expect(row?.[1]).toContain('adjusted yearly totals can differ from raw ones');
      } else {
        // With calendar effects estimated (examples/harbour-freight) the identity names the calendar part.
        const parts = s.components.calendar
          ? 'trend + seasonal + calendar + remainder'
          : 'trend + seasonal + remainder';
        expect(row?.[1]).toBe(`additive: data = ${parts}`);
      }
    },
  );
  test('the examples include a multiplicative series', () => {
    expect(briefs.some((b) => b.brief.series.some((s) => s.settings.model === 'multiplicative'))).toBe(true);
  });
});
