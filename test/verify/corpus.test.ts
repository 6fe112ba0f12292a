/**
 * The verifier over the corpus of open datasets (test/verify/corpus/, sources in corpus.json): every claim
 * of every brief, under several job settings each, must be true of the data. A case the tool refuses must
 * be refused with a located error, never a crash; the refusals expected today are listed with their reason.
 */
import { describe, expect, test } from 'vitest';
import { describeFindings, verifySeries } from '../../src/verify/index.js';
import { buildCase, DATASETS, SETTINGS } from './corpus.js';

/**
 * Cases the tool refuses, by dataset (none today: a brief needs two whole seasonal cycles, and with less
 * than two years it says what it cannot compare; electricity-hourly, 12 weeks, was refused before).
 */
const REFUSED: Record<string, string> = {};

describe('the corpus covers what the claims must hold for', () => {
  test('every frequency, levels and flows, a percentage, zero crossings, no seasonality, a short series', () => {
    const f = new Set(DATASETS.map((d) => d.frequency));
    expect([...f].sort()).toEqual(['daily', 'hourly', 'monthly', 'quarterly', 'weekly']);
    expect(DATASETS.some((d) => d.unit === '%')).toBe(true);
    expect(DATASETS.some((d) => d.combine === 'mean') && DATASETS.some((d) => d.combine === 'sum')).toBe(true);
    expect(DATASETS.some((d) => /crosses zero/.test(d.note))).toBe(true);
    expect(DATASETS.some((d) => /no (yearly )?seasonality/.test(d.note))).toBe(true);
    expect(DATASETS.some((d) => d.n <= 25)).toBe(true);
    for (const d of DATASETS) expect(d.source).toMatch(/^R (datasets|package \w+):/);
  });
});

describe.each(DATASETS.map((d) => [d.id, d] as const))('%s', (_id, d) => {
  test.each(SETTINGS.map((s) => [s.name, s] as const))(
    '%s: no false claim',
    async (_name, setting) => {
      const r = await buildCase(d, setting);
      if (r === null) return; // the setting does not apply to this dataset
      if (REFUSED[d.id]) {
        expect(r.error?.code).toBe(REFUSED[d.id]);
        return;
      }
      expect(r.error?.message ?? null).toBeNull();
      const s = r.brief?.series[0];
      if (!s) throw new Error('no series');
      expect(s.statements.length).toBeGreaterThan(5);
      expect(describeFindings(verifySeries(s, r.values.slice(0, s.components.observed.length)))).toBe('');
    },
    120_000,
  );
});
