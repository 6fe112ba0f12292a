/**
 * The sensitivity search's short cuts (analyse/sensitivity.ts) against the step-by-step walk with a fit per
 * trial, which TRENDBRIEF_EXHAUSTIVE_REFITS=1 restores: robust fits gallop over the grid, fits linear in
 * the data or their logarithms binary-search it, and fits linear in the data run the search on the line
 * three fits give. On the examples (two of them additive, where the line is searched), the open datasets of
 * the verifier's corpus under robust STL (sources in test/verify/corpus/corpus.json) and the twelve invented
 * series of bench/brief-12.yaml, the reported figures must be the walk's: the stated tolerance is none (the
 * same boundary cell is bisected by the same steps, so the value is the same to the last bit; the line could
 * differ only where a trial's step lies within rounding of zero). test/analyse/sensitivity-line.test.ts
 * holds the line to the walk on the corpus's monthly and quarterly sets.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { EXAMPLE_NAMES, EXAMPLES_DIR } from '../narrate/examples.js';
import { buildCase, DATASETS, SETTINGS } from '../verify/corpus.js';

async function bothWays<T>(make: () => Promise<T>): Promise<[T, T]> {
  const fast = await make();
  process.env.TRENDBRIEF_EXHAUSTIVE_REFITS = '1';
  try {
    return [fast, await make()];
  } finally {
    delete process.env.TRENDBRIEF_EXHAUSTIVE_REFITS;
  }
}

/** The firmness and sensitivity figures a brief reports, per series. */
function figures(brief: Brief) {
  return brief.series.map((s) => ({
    id: s.id,
    firmness: s.analysis.firmness,
    sensitivity: s.analysis.sensitivity,
    statements: s.statements.map((t) => t.text),
  }));
}

const jobBriefs = (file: string) => buildBriefs(loadJob(file), { toolVersion: 'test', charts: false, epoch: 0 });

describe('the short-cut sensitivity search against the exhaustive walk', () => {
  it('gives the same figures and words on every example and on bench/brief-12.yaml', async () => {
    const files = [
      ...EXAMPLE_NAMES.map((name) => join(EXAMPLES_DIR, name, 'job.yaml')),
      join(import.meta.dirname, '..', '..', 'bench', 'brief-12.yaml'),
    ];
    let robust = 0;
    for (const file of files) {
      const [fast, full] = await bothWays(() => jobBriefs(file));
      expect(fast.length).toBe(full.length);
      fast.forEach((u, i) => {
        if (u.error) throw u.error;
        const a = figures(u.brief as Brief);
        const b = figures(full[i].brief as Brief);
        expect(a).toEqual(b);
        robust += (u.brief as Brief).series.filter((s) => s.settings.robust).length;
      });
    }
    expect(robust).toBeGreaterThanOrEqual(5); // the comparison covers robust fits, where the search gallops
  }, 120000);

  it('gives the same figures on the open datasets of the corpus under robust STL', async () => {
    const setting = SETTINGS.find((s) => s.name.startsWith('robust stl'));
    if (!setting) throw new Error('the corpus has no robust setting');
    let found = 0;
    for (const d of DATASETS) {
      const [fast, full] = await bothWays(() => buildCase(d, setting));
      if (!fast?.brief || !full?.brief) continue;
      expect(figures(fast.brief)).toEqual(figures(full.brief));
      if (fast.brief.series.some((s) => s.analysis.sensitivity.side !== 'none')) found++;
    }
    expect(found).toBeGreaterThan(5);
  }, 300000);
});
