/**
 * The job loader never crashes: whatever a job file holds, loadJob either returns a Job or throws a
 * BriefError (or BriefErrors, one per mistake) whose every line names the job file with a line and column,
 * says what is wrong and (after " — ") how to fix it. The rule is the project's (DEVELOPERS.md: bad input
 * always gets a one-line located error, never a stack trace).
 *
 * loadJob reads a path, so each case is written to a temporary job.yaml beside a real data file, logo and
 * templates folder (the content checks look for them). Seeded, so CI runs the same cases every time.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { BriefError, BriefErrors } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import { hostileJob, jobText, mutatedJob } from './job-generators.js';

const RUNS = 300;
const DIR = mkdtempSync(join(tmpdir(), 'tb-fuzz-job-'));
mkdirSync(join(DIR, 'data'));
mkdirSync(join(DIR, 'templates'));
writeFileSync(join(DIR, 'data', 'values.csv'), 'month,value\n2024-01,1\n');
writeFileSync(join(DIR, 'logo.png'), Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
const JOB = join(DIR, 'job.yaml');

afterAll(() => rmSync(DIR, { recursive: true, force: true }));

/** Writes the bytes as the job file and loads it; a failure must be located, one line per mistake. */
function check(bytes: Uint8Array | string): 'loaded' | 'refused' {
  writeFileSync(JOB, bytes);
  try {
    const job = loadJob(JOB);
    expect(job.series.length).toBeGreaterThan(0);
    return 'loaded';
  } catch (e) {
    if (!(e instanceof BriefError)) throw e;
    const lines = e instanceof BriefErrors ? e.errors.map((x) => x.oneLine()) : [e.oneLine()];
    expect(e.oneLine().split('\n')).toHaveLength(lines.length);
    for (const line of lines) {
      expect(line).not.toContain('\n');
      // The file, then a line and column.
      expect(line.startsWith(`${JOB}:`)).toBe(true);
      expect(line.slice(JOB.length)).toMatch(/^:\d+:\d+: /);
      expect(line).toContain(' — ');
    }
    expect(e.exitCode).toBe(2);
    return 'refused';
  }
}

describe('loadJob on arbitrary input', () => {
  it('raw bytes', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 400 }), (bytes) => {
        check(bytes);
      }),
      { seed: 20260201, numRuns: RUNS },
    );
  });

  it('arbitrary Unicode text', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme', maxLength: 300 }), (text) => {
        check(text);
      }),
      { seed: 20260202, numRuns: RUNS },
    );
  });

  it('YAML-ish text: keys, indentation, lists, flow collections, anchors and tags in random order', () => {
    fc.assert(
      fc.property(jobText, (text) => {
        check(text);
      }),
      { seed: 20260203, numRuns: RUNS },
    );
  });

  it('a valid job with random values at random keys, written as YAML, then random breakage', () => {
    const outcomes = { loaded: 0, refused: 0 };
    fc.assert(
      fc.property(mutatedJob, (text) => {
        outcomes[check(text)]++;
      }),
      { seed: 20260204, numRuns: RUNS },
    );
    // Both outcomes occur, so the generator explores valid jobs as well as broken ones.
    expect(outcomes.loaded).toBeGreaterThan(10);
    expect(outcomes.refused).toBeGreaterThan(10);
  });

  it('hostile jobs: deep nesting, huge text, control characters, thousands of unknown keys', () => {
    // Once: a stack overflow with no place, a crash in the PDF, a NUL copied into the HTML, a minute of work.
    fc.assert(
      fc.property(hostileJob, (text) => {
        check(text);
      }),
      { seed: 20260205, numRuns: 40 },
    );
  }, 120_000);
});
