/**
 * The Brief carries each series' period index (periodIndex) and the ordinals of its spans, so stages after
 * analyse/ read periods without parsing labels. Checked on the examples: every label is the start of the
 * period its ordinal names, read back with JavaScript's own Date.parse (the ECMAScript date-time format,
 * not our parser); the JSON keeps only the labels; and the stages after analyse/ parse no label of the
 * series (a source scan, with the two kinds of label that come from outside the index listed).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { renderJsonPieces } from '../../src/render/json.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { ordinalAt, startOf } from '../../src/vocabulary/period-index.js';

const ROOT = join(import.meta.dirname, '..', '..');
const EXAMPLES = ['clinic-visits', 'harbour-freight', 'online-orders', 'water-deliveries'];
const options = { toolVersion: 'test', charts: false, epoch: 0 };

/** The instant an ISO label names, by the language's own parser (a date alone is UTC midnight). */
const parsed = (iso: string) => Date.parse(iso);

describe.each(EXAMPLES)('%s: periods by ordinal', async (name) => {
  const units = await buildBriefs(loadJob(join(ROOT, 'examples', name, 'job.yaml')), options);
  const briefs = units.map((u) => u.brief).filter((b): b is Brief => b !== null);

  test('each label is the start of the period its position names', () => {
    expect(briefs.length).toBeGreaterThan(0);
    for (const s of briefs.flatMap((b) => b.series)) {
      const { dates } = s.components;
      expect(s.periodIndex.frequency).toBe(s.frequency);
      expect(s.periodIndex.length).toBe(dates.length);
      for (let i = 0; i < dates.length; i++) {
        expect(startOf(s.frequency, ordinalAt(s.periodIndex, i))).toBe(parsed(dates[i]));
      }
      expect(s.reportingDate).toBe(dates[s.reportingIndex]);
    }
  });

  test('spans carry the ordinals of their labels', () => {
    for (const s of briefs.flatMap((b) => b.series)) {
      const spans = [...s.analysis.comparisons, ...s.analysis.comparisonsLeftOut].flatMap((c) => [
        c.current,
        c.baseline,
      ]);
      expect(spans.length).toBeGreaterThan(0);
      for (const span of spans) {
        expect(startOf(s.frequency, span.ordinals.first)).toBe(parsed(span.from));
        expect(startOf(s.frequency, span.ordinals.last)).toBe(parsed(span.to));
        expect(span.ordinals.last - span.ordinals.first + 1).toBe(span.periods);
      }
      for (const y of s.yearlyTotals?.years ?? []) {
        expect(startOf(s.frequency, y.ordinals.first)).toBe(parsed(y.from));
        expect(startOf(s.frequency, y.ordinals.last)).toBe(parsed(y.to));
      }
    }
  });

  test('the JSON gives the labels only', () => {
    const json = Buffer.concat([...renderJsonPieces(briefs[0])]).toString('utf8');
    expect(json).not.toMatch(/"periodIndex"|"ordinals"/);
    expect(json).toContain(`"reportingDate": "${briefs[0].series[0].reportingDate}"`);
  });
});

test('stages after analyse/ parse no period label of the series', () => {
  // Labels from outside the period index: the data stage's list of gaps and the record's earlier briefs.
  const allowed = new Map([
    ['document/view.ts', 1],
    ['narrate/history.ts', 1],
  ]);
  const found: string[] = [];
  for (const stage of ['narrate', 'chart', 'document']) {
    const dir = join(ROOT, 'src', stage);
    for (const file of readdirSync(dir, { recursive: true }) as string[]) {
      if (!file.endsWith('.ts')) continue;
      const text = readFileSync(join(dir, file), 'utf8');
      const calls = (text.match(/\bDate\.parse\(|\bordinalOfIso\(/g) ?? []).length;
      const key = `${stage}/${file}`;
      if (calls > (allowed.get(key) ?? 0)) found.push(`${key}: ${calls}`);
    }
  }
  expect(found).toEqual([]);
});
