/**
 * Vega locale definitions drawn from Intl. Expected separators are CLDR conventions (common practice):
 * en-GB "1,234,567.5", de-DE "1.234.567,5", en-IN "12,34,567.5" (groups of three, then two).
 */
import { describe, expect, it } from 'vitest';
import { vegaLocale } from '../../src/chart/locale.js';

describe('vegaLocale', () => {
  it.each([
    ['en-GB', '.', ',', [3]],
    ['de-DE', ',', '.', [3]],
    ['en-IN', '.', ',', [3, 2]],
  ])('%s writes decimals with "%s", groups with "%s" in groups of %j', (locale, decimal, thousands, grouping) => {
    const { number } = vegaLocale(locale);
    expect(number?.decimal).toBe(decimal);
    expect(number?.thousands).toBe(thousands);
    expect(number?.grouping).toEqual(grouping);
    expect(number?.numerals).toBeUndefined();
  });

  it('lists months from January and weekdays from Sunday, as d3 expects', () => {
    const { time } = vegaLocale('en-GB');
    expect(time?.months[0]).toBe('January');
    expect(time?.months[11]).toBe('December');
    expect(time?.days[0]).toBe('Sunday');
    expect(time?.days[1]).toBe('Monday');
  });
});
