/**
 * loadJob on whole files: a job using every key resolves to the Job the format description promises, a job
 * with only the required keys gets every default, `defaults:` reaches each series, and files that cannot
 * be read give one located line. Expected values are read off the fixture files by hand.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import type { EffectsSpec, Job } from '../../src/vocabulary/settings.js';

/** The keys of a workbook or database source, as a file source resolves them. */
const FILE_SOURCE = {
  sheet: null,
  range: null,
  headerRow: null,
  query: null,
  connectionEnv: null,
  parameters: [],
  timeoutSeconds: 60,
};

const FILES = fileURLToPath(new URL('./files/', import.meta.url)).replace(/\/$/, '');

function failure(path: string): BriefError {
  try {
    loadJob(path);
  } catch (e) {
    if (e instanceof BriefError) return e;
    throw e;
  }
  throw new Error(`${path} loaded without an error`);
}

/** Effects when the job sets none (src/job/defaults.ts, schema/job.schema.json's defaults). */
const NO_EFFECTS: EffectsSpec = {
  days: 'none',
  leapYear: false,
  easterDays: null,
  holidays: null,
  holidayFile: null,
  holidayFileAsWritten: null,
  events: [],
  find: 'auto',
  findKinds: ['one-off', 'step', 'fading'],
};

describe('a job using every key', () => {
  const dir = join(FILES, 'full');
  const job = loadJob(join(dir, 'job.yaml'));

  it('resolves to the expected Job', () => {
    const expected: Job = {
      file: join(dir, 'job.yaml'),
      dir,
      sha256: job.sha256, // checked on its own below
      brief: {
        title: 'Monthly water deliveries',
        organisation: 'Riverside Water Authority',
        author: 'Network analytics',
        contact: 'analytics@riverside.example',
        period: '2026-09',
        locale: 'de-DE',
        fiscalYearStartMonth: 7,
        outputs: ['html', 'pdf', 'eml', 'json'],
        chartFiles: [],
        pageSize: 'Letter',
        pdfEngine: 'browser',
        pdfArchival: true,
        accentColour: '#0B6E4F',
        layout: {
          sections: ['overview', 'series', 'cautions', 'method', 'data'],
          seriesSections: ['headline', 'key_figures', 'notes', 'charts', 'comparisons', 'unusual', 'firmness'],
          dataPeriods: 400,
        },
        logo: join(dir, 'assets/logo.svg'),
        templates: join(dir, 'my-templates'),
        email: {
          subject: 'Water deliveries, September',
          from: 'Network analytics <analytics@riverside.example>',
          to: ['ops@riverside.example'],
          cc: ['board@riverside.example', 'audit@riverside.example'],
        },
      },
      series: [
        {
          id: 'deliveries',
          label: 'Water delivered',
          unit: 'ML',
          aggregation: 'sum',
          goodDirection: 'up',
          data: {
            file: join(dir, 'data/deliveries.csv'),
            fileAsWritten: 'data/deliveries.csv',
            format: 'csv',
            dateColumn: 'month',
            valueColumn: 'delivered_ml',
            filter: { column: 'zone', values: ['North'] },
            groupBy: 'site',
            // German writes 1,5 (CLDR number symbols for de; common practice).
            decimal: ',',
            delimiter: ';',
            ...FILE_SOURCE,
          },
          frequency: 'monthly',
          decomposition: {
            method: 'stl',
            model: 'additive', // the series' own model wins over defaults' multiplicative
            period: 12,
            periods: null,
            seasonalWindow: 13,
            seasonalDegree: 1,
            trendWindow: 23,
            trendDegree: 0,
            lowpassWindow: 13,
            lowpassDegree: 0,
            robust: true, // not set in the series: from defaults.decomposition
            inner: 1,
            outer: 15,
            iterations: null,
            henderson: 13,
            extend: 'auto',
            matchYearlyTotals: false,
          },
          effects: NO_EFFECTS,
          firmnessPeriods: 36,
          changeAs: 'auto',
        },
        {
          id: 'energy',
          label: 'Pumping energy',
          unit: 'kWh', // from defaults
          aggregation: 'mean', // from defaults
          goodDirection: 'down', // from defaults
          data: {
            file: join(dir, 'data/energy.json'),
            fileAsWritten: 'data/energy.json',
            format: 'json', // from the extension
            dateColumn: 'day',
            valueColumn: 'kwh',
            // `007` is kept as written, not read as the number 7.
            filter: { column: 'zone', values: ['North', '007'] },
            groupBy: null,
            decimal: '.', // set in the job, over the locale's comma
            delimiter: ',',
            ...FILE_SOURCE,
          },
          frequency: 'daily', // from defaults
          decomposition: {
            method: 'mstl',
            model: 'multiplicative', // from defaults
            period: null,
            periods: [7, 365],
            seasonalWindow: [11, 'periodic'],
            seasonalDegree: null,
            trendWindow: null,
            trendDegree: null,
            lowpassWindow: null,
            lowpassDegree: null,
            robust: true,
            inner: null,
            outer: null,
            iterations: 3,
            henderson: null, // henderson: false
            extend: 'auto',
            matchYearlyTotals: false,
          },
          effects: NO_EFFECTS,
          firmnessPeriods: 24,
          changeAs: 'auto',
        },
      ],
      comparisons: [
        { kind: 'year-on-year', label: null },
        { kind: 'year-to-date', label: null },
        { kind: 'fiscal-year-to-date', label: null },
        { kind: 'latest-year', label: null },
        { kind: 'custom', label: 'Winter 2025–26', current: ['2025-12', '2026-02'], baseline: ['2024-12', '2025-02'] },
        { kind: 'year-on-year', label: 'Same month last year' },
      ],
      record: {
        store: 'postgres',
        file: join(dir, 'history', 'briefs.sqlite'),
        connectionEnv: 'BRIEFS_DB',
        name: 'water-monthly',
        required: true,
      },
    };
    expect(job).toEqual(expected);
  });

  it('hashes the bytes of the file', () => {
    expect(job.sha256).toBe(
      createHash('sha256')
        .update(readFileSync(join(dir, 'job.yaml')))
        .digest('hex'),
    );
  });
});

describe('a job with only the required keys', () => {
  const dir = join(FILES, 'minimal');
  const job = loadJob(join(dir, 'job.yaml'));

  it('gets every default of the format description', () => {
    expect(job.brief).toEqual({
      title: 'Monthly water deliveries',
      organisation: '',
      author: '',
      contact: '',
      period: null,
      locale: 'en-GB',
      fiscalYearStartMonth: 1,
      outputs: ['html', 'pdf'],
      chartFiles: [],
      pageSize: 'A4',
      pdfEngine: 'builtin',
      pdfArchival: false,
      accentColour: '#1F5C99',
      layout: {
        sections: ['overview', 'series', 'cautions', 'method', 'data'],
        seriesSections: ['headline', 'key_figures', 'notes', 'charts', 'comparisons', 'unusual', 'firmness'],
        dataPeriods: 400,
      },
      logo: null,
      templates: null,
      email: { subject: null, from: null, to: [], cc: [] },
    });
    expect(job.series).toEqual([
      {
        id: 'deliveries',
        label: 'Water delivered',
        unit: '',
        aggregation: 'sum',
        goodDirection: 'neither',
        data: {
          file: join(dir, 'data/deliveries.csv'),
          fileAsWritten: 'data/deliveries.csv',
          format: 'csv',
          dateColumn: 'month',
          valueColumn: 'delivered_ml',
          filter: null,
          groupBy: null,
          decimal: '.', // en-GB writes 1.5
          delimiter: ',',
          ...FILE_SOURCE,
        },
        frequency: null,
        decomposition: {
          method: 'stl',
          model: 'auto',
          period: null,
          periods: null,
          seasonalWindow: null,
          seasonalDegree: null,
          trendWindow: null,
          trendDegree: null,
          lowpassWindow: null,
          lowpassDegree: null,
          robust: false,
          inner: null,
          outer: null,
          iterations: null,
          henderson: null,
          extend: 'auto',
          matchYearlyTotals: false,
        },
        effects: NO_EFFECTS,
        firmnessPeriods: 24,
        changeAs: 'auto',
      },
    ]);
    expect(job.comparisons).toEqual([
      { kind: 'year-on-year', label: null },
      { kind: 'year-to-date', label: null },
      { kind: 'latest-year', label: null },
    ]);
  });
});

describe('defaults: shared by the series', () => {
  const job = loadJob(join(FILES, 'shared-defaults.yaml'));
  const [north, south] = job.series;

  it('fills what a series leaves out and yields to what it sets', () => {
    expect([north.aggregation, north.goodDirection, north.unit, north.frequency]).toEqual([
      'mean',
      'down',
      'kWh',
      'hourly',
    ]);
    expect([south.aggregation, south.goodDirection, south.unit, south.frequency]).toEqual([
      'sum',
      'neither',
      'MWh',
      'daily',
    ]);
  });

  it('merges decomposition key by key', () => {
    expect(north.decomposition).toMatchObject({ method: 'mstl', periods: [24, 168], robust: true, iterations: null });
    // south keeps method mstl from defaults but its own periods, robust and iterations.
    expect(south.decomposition).toMatchObject({ method: 'mstl', periods: [7, 365], robust: false, iterations: 3 });
  });

  it('takes the decimal mark from the locale unless the series sets it', () => {
    // en-AU writes 1.5 (CLDR; common practice); south sets "," itself.
    expect([north.data.decimal, south.data.decimal]).toEqual(['.', ',']);
  });
});

describe('periods as written', () => {
  it('keeps a full date a string, even under a YAML 1.1 directive that would make it a timestamp', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trendbrief-job-'));
    mkdirSync(join(dir, 'data'));
    writeFileSync(join(dir, 'data', 'deliveries.csv'), 'month,delivered_ml\n');
    const body = readFileSync(join(FILES, 'minimal', 'job.yaml'), 'utf8').replace(
      '  title: Monthly water deliveries\n',
      '  title: Monthly water deliveries\n  period: 2026-09-15\n',
    );
    writeFileSync(join(dir, 'a.yaml'), body);
    writeFileSync(join(dir, 'b.yaml'), `%YAML 1.1\n---\n${body}`);
    expect(loadJob(join(dir, 'a.yaml')).brief.period).toBe('2026-09-15');
    expect(loadJob(join(dir, 'b.yaml')).brief.period).toBe('2026-09-15');
  });
});

describe('files that cannot be read', () => {
  it('names a missing job file', () => {
    const path = join(FILES, 'no-such-job.yaml');
    expect(failure(path).oneLine()).toBe(`${path}: job file ${path} not found — check the path and the current folder`);
  });

  it('points from a folder to the job file inside it', () => {
    const path = join(FILES, 'folder-job');
    expect(failure(path).oneLine()).toBe(
      `${path}: ${path} is a folder, not a job file — did you mean ${join(path, 'job.yaml')}?`,
    );
  });

  it('asks for the file itself when the folder holds no job file', () => {
    const path = join(FILES, 'full', 'assets');
    expect(failure(path).oneLine()).toBe(
      `${path}: ${path} is a folder, not a job file — give the path of the .yaml file itself`,
    );
  });

  it('rejects bytes that are not UTF-8', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trendbrief-job-'));
    const path = join(dir, 'job.yaml');
    writeFileSync(path, Buffer.from([0x62, 0x72, 0x69, 0x65, 0x66, 0x3a, 0x20, 0xff, 0xfe])); // "brief: " + invalid bytes
    // "brief: " is 7 bytes, so the first bad byte, 0xFF, is byte 8 of line 1.
    expect(failure(path).oneLine()).toBe(`${path}:1:8: ${path} is not UTF-8 text — save the job file as UTF-8`);
  });

  it('hashes the bytes as stored, line endings included', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trendbrief-job-'));
    mkdirSync(join(dir, 'data'));
    writeFileSync(join(dir, 'data', 'deliveries.csv'), 'month,delivered_ml\n');
    const text = readFileSync(join(FILES, 'minimal', 'job.yaml'), 'utf8').replace(/\n/g, '\r\n');
    writeFileSync(join(dir, 'job.yaml'), text);
    const job = loadJob(join(dir, 'job.yaml'));
    expect(job.sha256).toBe(createHash('sha256').update(Buffer.from(text, 'utf8')).digest('hex'));
    expect(job.sha256).not.toBe(createHash('sha256').update(text.replace(/\r\n/g, '\n')).digest('hex'));
  });
});

describe('files made to exhaust the reader', () => {
  const GOOD_DATA = fileURLToPath(new URL('../bad-input/good/data/values.csv', import.meta.url));
  const head = `brief:\n  title: Exhausting\nseries:\n  - id: s\n    label: S\n    combine: sum\n    data: { file: ${JSON.stringify(GOOD_DATA)}, date: month, value: value }\n`;
  const write = (text: string): string => {
    const path = join(mkdtempSync(join(tmpdir(), 'trendbrief-job-')), 'job.yaml');
    writeFileSync(path, text);
    return path;
  };

  it('reports each of 10,000 unknown keys once, at its own line', () => {
    // Once quadratic (10,000 keys took a minute): yaml's duplicate-key check and the schema's branch checks
    // each compared every key with every other. The time is the benchmark's business; the result is this.
    const n = 10_000;
    const keys = Array.from({ length: n }, (_, i) => `  unknown_${i}: ${i}\n`).join('');
    const path = write(head.replace('  title: Exhausting\n', `  title: Exhausting\n${keys}`));
    const e = failure(path);
    const lines = e.oneLine().split('\n');
    expect(lines).toHaveLength(n);
    // "brief:" and "title:" are lines 1 and 2; key i is on line i + 3.
    for (const i of [0, 1, 4999, n - 1])
      expect(lines[i]).toBe(`${path}:${i + 3}:3: unknown key "unknown_${i}" in brief — keys allowed here: ${ALLOWED}`);
  });

  it('still finds a key written twice in one mapping, at the second', () => {
    const path = write(head.replace('  title: Exhausting\n', '  title: Exhausting\n  author: A\n  author: B\n'));
    expect(failure(path).oneLine()).toBe(`${path}:4:3: this key appears twice in the same mapping — keep one of them`);
  });

  it('stops at the 65th level of nesting, by indentation or by brackets, where it starts', () => {
    // Block mappings: the top-level mapping is level 1, the one holding k0 level 2, the one holding k63 level 65.
    const block = Array.from({ length: 3000 }, (_, i) => `${'  '.repeat(i + 1)}k${i}:\n`).join('');
    const path1 = write(`${head}defaults:\n${block}${'  '.repeat(3001)}v: 1\n`);
    // "defaults:" is on line 8 and k0 on line 9, so k63 is on line 72, at column 2·64 + 1.
    expect(failure(path1).oneLine()).toMatch(
      new RegExp(`^${path1}:72:129: the lists and mappings are nested more than 64 levels deep — `),
    );
    const path2 = write(`${head}defaults:\n  x: ${'['.repeat(3000)}${']'.repeat(3000)}\n`);
    // Column 6 holds the first "[" (level 3); the 63rd, at column 68, opens level 65.
    expect(failure(path2).oneLine()).toMatch(new RegExp(`^${path2}:9:68: the lists and mappings are nested`));
  });
});

const ALLOWED =
  'title, organisation, author, contact, period, locale, fiscal_year_start, outputs, chart_files, page_size, pdf_engine, pdf_archival, accent, sections, series_sections, data_periods, logo, templates, email';
