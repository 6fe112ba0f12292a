/**
 * The data loader never crashes: whatever bytes a data file holds and whatever the job says about it,
 * loadDataFromBytes either returns a series or throws a BriefError whose one line names the file, says
 * what is wrong and (after " — ") how to fix it. Never a TypeError, a RangeError or a parser's own error.
 * The rule is the project's (DEVELOPERS.md: bad input always gets a one-line located error).
 *
 * Seeded, so CI runs the same cases every time; a failure prints the seed and path to replay it.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { loadDataFromBytes } from '../../src/data/load.js';
import { BriefError, BriefErrors } from '../../src/errors.js';
import type { Frequency } from '../../src/vocabulary/period-index.js';
import type { DataSpec } from '../../src/vocabulary/settings.js';
import { csvCase, dataSpec, FILE, jsonText } from './generators.js';

const RUNS = 300;

/** Loads, and returns null on success or the error, which must be a located, one-line BriefError. */
function loadOrError(bytes: Uint8Array, spec: DataSpec, hint: Frequency | null): BriefError | null {
  try {
    const loaded = loadDataFromBytes(bytes, spec, hint);
    // A success is a real series: one value slot per period, dates and gaps that agree with it.
    for (const g of loaded.groups) {
      if (g.series.values.length !== g.series.index.length) throw new Error('values and index lengths differ');
      if (g.dates.length !== g.series.index.length) throw new Error('dates and index lengths differ');
      const missing = g.series.values.filter((v) => Number.isNaN(v)).length;
      if (g.gaps.length !== missing) throw new Error('gaps do not match the NaN values');
    }
    return null;
  } catch (e) {
    if (!(e instanceof BriefError)) throw e;
    return e;
  }
}

function expectLocated(e: BriefError | null): void {
  if (e === null) return;
  const lines = e instanceof BriefErrors ? e.errors.map((x) => x.oneLine()) : [e.oneLine()];
  for (const line of lines) {
    expect(line).not.toContain('\n');
    expect(line.startsWith(`${FILE}`)).toBe(true);
    expect(line).toContain(' — ');
    expect(e.hint.trim().length).toBeGreaterThan(0);
  }
  expect(e.exitCode).toBe(2);
}

const frequencyHint = fc.constantFrom<Frequency | null>(
  null,
  null,
  'monthly',
  'daily',
  'quarterly',
  'weekly',
  'hourly',
);

describe('loadDataFromBytes on arbitrary input', () => {
  it('raw bytes as a CSV file', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 600 }), dataSpec('csv'), frequencyHint, (bytes, spec, hint) => {
        expectLocated(loadOrError(bytes, spec, hint));
      }),
      { seed: 20260101, numRuns: RUNS },
    );
  });

  it('raw bytes as a JSON file', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 600 }), dataSpec('json'), frequencyHint, (bytes, spec, hint) => {
        expectLocated(loadOrError(bytes, spec, hint));
      }),
      { seed: 20260102, numRuns: RUNS },
    );
  });

  it('arbitrary Unicode text as a CSV file', () => {
    fc.assert(
      fc.property(
        fc.string({ unit: 'grapheme', maxLength: 400 }),
        dataSpec('csv'),
        frequencyHint,
        (text, spec, hint) => {
          expectLocated(loadOrError(Buffer.from(text, 'utf8'), spec, hint));
        },
      ),
      { seed: 20260103, numRuns: RUNS },
    );
  });

  it('CSV-ish text: a header, dates and numbers of every accepted form, and random breakage', () => {
    fc.assert(
      fc.property(csvCase, frequencyHint, ([text, spec], hint) => {
        expectLocated(loadOrError(Buffer.from(text, 'utf8'), spec, hint));
      }),
      { seed: 20260104, numRuns: RUNS },
    );
  });

  it('JSON-ish text: arrays of records with dates and numbers, and random breakage', () => {
    fc.assert(
      fc.property(jsonText, dataSpec('json'), frequencyHint, (text, spec, hint) => {
        expectLocated(loadOrError(Buffer.from(text, 'utf8'), spec, hint));
      }),
      { seed: 20260105, numRuns: RUNS },
    );
  });

  it('the structured generator does reach the success path (so the property is not only about errors)', () => {
    let successes = 0;
    let failures = 0;
    fc.assert(
      fc.property(csvCase, ([text, spec]) => {
        const e = loadOrError(Buffer.from(text, 'utf8'), spec, null);
        if (e === null) successes++;
        else failures++;
      }),
      { seed: 20260106, numRuns: RUNS },
    );
    // Both outcomes occur in a few hundred runs; otherwise the generator has drifted to one side.
    expect(successes).toBeGreaterThan(10);
    expect(failures).toBeGreaterThan(10);
  });
});
