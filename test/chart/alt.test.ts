/**
 * The alt sentences: one plain sentence each, with the figures a reader looks for, written the locale's way
 * (en-GB groups thousands with ",", de-DE with "." and marks decimals with ","; CLDR, common practice).
 */
import { describe, expect, it } from 'vitest';
import {
  adjustedTrendAlt,
  comparisonsAlt,
  observedTrendAlt,
  remainderAlt,
  seasonalProfileAlt,
  yoyAlt,
} from '../../src/chart/alt.js';
import { sampleSeries } from './sample.js';

const ALL = [observedTrendAlt, adjustedTrendAlt, seasonalProfileAlt, remainderAlt, yoyAlt, comparisonsAlt];

describe('alt text', () => {
  it('is one sentence for every chart', () => {
    const series = sampleSeries();
    for (const alt of ALL) {
      const text = alt(series, 'en-GB');
      expect(text).toMatch(/^[A-Z].*\.$/);
      // No full stop followed by a new sentence inside it.
      expect(text.slice(0, -1)).not.toMatch(/\.\s+[A-Z]/);
    }
  });

  it('names the span, the trend’s start and end and the provisional count', () => {
    // sample.ts: trend 1000 + 5·i over 48 months from January 2021; the last is 1000 + 5·47 = 1,235.
    const series = sampleSeries({ trend: Array.from({ length: 48 }, (_, i) => 1000 + 5 * i), provisionalCount: 6 });
    const text = observedTrendAlt(series, 'en-GB');
    expect(text).toBe(
      'Line chart of Water delivered from Jan 2021 to Dec 2024: the trend rose from 1,000 to 1,235 ML; ' +
        'the last 6 values of the trend are provisional.',
    );
    expect(observedTrendAlt(series, 'de-DE')).toContain('from 1.000 to 1.235 ML');
  });

  it('says "fell" for a falling trend and leaves out the provisional clause when there is none', () => {
    const series = sampleSeries({ trend: Array.from({ length: 48 }, (_, i) => 200 - i), provisionalCount: 0 });
    const text = observedTrendAlt(series, 'en-GB');
    expect(text).toContain('the trend fell from 200 to 153 ML');
    expect(text).not.toContain('provisional');
  });

  it('gives the seasonal peak and trough from the analysis', () => {
    // sample.ts pattern: July +9 is the highest, December −10 the lowest.
    const text = seasonalProfileAlt(sampleSeries(), 'en-GB');
    expect(text).toContain('12 seasons');
    expect(text).toContain('highest in Jul (+9.0 ML)');
    expect(text).toContain('lowest in Dec (−10.0 ML)');
  });

  it('counts the unusual values and the year-over-year rises and falls', () => {
    expect(remainderAlt(sampleSeries({ spikes: [3, 9] }), 'en-GB')).toContain('2 unusual values');
    expect(remainderAlt(sampleSeries({ spikes: [] }), 'en-GB')).toContain('no value stands out');
    // Trend 100 + i to i = 35, then 90 (see marks.test.ts): 24 rises, 12 falls; first i = 12: 112/100 − 1 = +12.0 %,
    // last i = 47: 90/(88 + 47) − 1 = 90/135 − 1 = −33.3 %.
    const trend = Array.from({ length: 48 }, (_, i) => (i < 36 ? 100 + i : 90));
    const text = yoyAlt(sampleSeries({ trend }), 'en-GB');
    expect(text).toContain('36 periods');
    expect(text).toContain('+12.0% at the start and −33.3% at the end');
    expect(text).toContain('24 rises and 12 falls');
  });
});
