/**
 * The holiday file a job names (src/data/holiday-file.ts): both forms, and every way it can be wrong, each
 * with the file and row named. Dates worked by hand.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { HOLIDAY_FILE_MAX_BYTES, parseHolidayFile, readHolidayFile } from '../../src/data/holiday-file.js';
import { BriefError } from '../../src/errors.js';

const DAY = 86_400_000;
const iso = (day: number) => new Date(day * DAY).toISOString().slice(0, 10);
const parse = (text: string, options = {}) => parseHolidayFile(Buffer.from(text, 'utf8'), 'holidays.csv', options);
const dir = mkdtempSync(join(tmpdir(), 'tb-holiday-file-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function lineOf(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (e instanceof BriefError) {
      expect(e.oneLine()).not.toContain('\n');
      return e.oneLine();
    }
    throw e;
  }
  throw new Error('no error');
}

describe('a holiday file', () => {
  it('a plain list: dates, optional names after a comma, semicolon or tab; comments and blank lines skipped', () => {
    const got = parse(
      '# works holidays\r\n2026-12-25, Christmas Day\r\n\r\n2026-12-28\r\n2027-01-01;"New Year, 2027"\n2026-12-24\tEve\n',
    );
    expect([...got.days].map(iso)).toEqual(['2026-12-24', '2026-12-25', '2026-12-28', '2027-01-01']);
    expect([...got.names].map(([d, n]) => [iso(d), n])).toEqual([
      ['2026-12-24', 'Eve'],
      ['2026-12-25', 'Christmas Day'],
      ['2027-01-01', 'New Year, 2027'],
    ]);
    expect(got.years).toEqual({ from: 2026, to: 2027 });
  });

  it('a CSV with a header: the date and name columns found in any case, other columns ignored, quoting as in data files', () => {
    const got = parse(
      'Region,Date,Name\nnorth,2026-04-03,"Good Friday"\nnorth,2026-04-06,"Easter Monday, the day after"\n',
    );
    expect([...got.days].map(iso)).toEqual(['2026-04-03', '2026-04-06']);
    expect(got.names.get(Date.UTC(2026, 3, 6) / DAY)).toBe('Easter Monday, the day after');
  });

  it('columns the job names', () => {
    const got = parse('when;what\n2026-05-01;Labour Day\n', { dateColumn: 'when', nameColumn: 'what' });
    expect([...got.names.values()]).toEqual(['Labour Day']);
    expect(lineOf(() => parse('when;what\n2026-05-01;x\n', { dateColumn: 'When' }))).toBe(
      'holidays.csv: row 1: the holiday file has no column "When"; columns found: "when", "what" — name the column of dates as the header writes it',
    );
  });
});

describe('bad holiday files: one line naming the file and row, and a fix', () => {
  it('a date not written YYYY-MM-DD, with its row', () => {
    expect(lineOf(() => parse('2026-12-25\n2026-12-26\n28/12/2026\n'))).toBe(
      'holidays.csv: row 3: "28/12/2026" is not a date written YYYY-MM-DD — write each holiday as year-month-day, such as 2026-12-25',
    );
    expect(lineOf(() => parse('date,name\n2026-12-25,a\n,b\n'))).toMatch(
      /^holidays\.csv: row 3, column "date": this row has no date/,
    );
  });

  it('a day the calendar does not have (2023 is no leap year), a year out of range', () => {
    expect(lineOf(() => parse('2024-02-29\n2023-02-29\n'))).toBe(
      'holidays.csv: row 2: 2023-02-29 is not a day of the calendar — check the month and the day',
    );
    expect(lineOf(() => parse('2026-13-01\n'))).toContain('row 1: 2026-13-01 is not a day of the calendar');
    expect(lineOf(() => parse('0226-12-25\n'))).toContain('row 1: 0226-12-25 lies outside the years 1900–2100');
  });

  it('a date listed twice names both rows', () => {
    expect(lineOf(() => parse('2026-12-25\n2026-12-26\n# again\n2026-12-25, Christmas\n'))).toBe(
      'holidays.csv: row 4: 2026-12-25 is listed twice (rows 1 and 4) — keep one row for each date; two holidays on one day go on one row, their names together',
    );
  });

  it('no dates at all; no date column', () => {
    expect(lineOf(() => parse('# nothing yet\n\n'))).toMatch(/^holidays\.csv: the holiday file holds no dates — /);
    expect(lineOf(() => parse('day,name\n2026-12-25,x\n'))).toMatch(
      /no column "date"; columns found: "day", "name" — call the column of dates "date"/,
    );
  });

  it('text that is not UTF-8 gets the data file’s message', () => {
    expect(lineOf(() => parseHolidayFile(Buffer.from([0x32, 0x30, 0xe9, 0x0a]), 'holidays.csv'))).toContain(
      'not valid UTF-8',
    );
  });

  it('a folder, a named pipe, a file too large, a missing file: refused unread', () => {
    const folder = join(dir, 'folder');
    mkdirSync(folder);
    expect(lineOf(() => readHolidayFile(folder, 'folder'))).toBe(
      'folder: the holiday file is a folder, not an ordinary file — point the job at a CSV or text file of dates',
    );
    const fifo = join(dir, 'pipe');
    execFileSync('mkfifo', [fifo]);
    expect(lineOf(() => readHolidayFile(fifo, 'pipe'))).toContain('pipe: the holiday file is a named pipe');
    const big = join(dir, 'big.csv');
    writeFileSync(big, '2026-12-25\n');
    truncateSync(big, HOLIDAY_FILE_MAX_BYTES + 1);
    expect(lineOf(() => readHolidayFile(big, 'big.csv'))).toMatch(
      /^big\.csv: the holiday file holds 4194305 bytes, more than the 4194304/,
    );
    expect(lineOf(() => readHolidayFile(join(dir, 'none.csv'), 'none.csv'))).toBe(
      'none.csv: the holiday file does not exist — check the path: it is relative to the job file',
    );
  });

  it('a good file on disk reads as parsed', () => {
    const good = join(dir, 'good.csv');
    writeFileSync(good, '2026-01-01,New Year\n');
    expect([...readHolidayFile(good, 'good.csv').days].map(iso)).toEqual(['2026-01-01']);
  });
});
