/**
 * Each kind of mistake in a job file gives one line `file:line:col: what — fix`, pointing at the offending
 * value (a missing key: its mapping; an unknown key: the key). Lines and columns are counted by hand from
 * the fixture files in files/bad/, 1-based, as editors count them; the arithmetic is beside each check.
 * The two files with broken YAML end in .txt so that the formatter, which parses .yaml files, skips them.
 */
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { BriefError, BriefErrors } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';

const BAD = fileURLToPath(new URL('./files/bad/', import.meta.url)).replace(/\/$/, '');

/** The error lines for a fixture, and the file name they start with. */
function report(name: string): { lines: string[]; f: string; error: BriefError } {
  const f = join(BAD, name);
  try {
    loadJob(f);
  } catch (e) {
    if (!(e instanceof BriefError)) throw e;
    return { lines: e.oneLine().split('\n'), f, error: e };
  }
  throw new Error(`${name} loaded without an error`);
}

describe('YAML syntax', () => {
  it('reports a key indented one space too far where the parser stops', () => {
    const { lines, f } = report('yaml-syntax.yaml.txt');
    // Line 6 "     combine: sum" is one space deeper than "label", so "Water delivered combine: sum" reads as
    // one value running into a key; the parser flags the value that starts on line 5 after "    label: "
    // (4 + 7 = 11 characters): column 12.
    expect(lines).toEqual([
      `${f}:5:12: a value runs on into a line that holds a key — check the indentation: keys beside each other start in the same column`,
    ]);
  });

  it('reports an unclosed [ list where the next key begins', () => {
    const { lines, f } = report('unclosed.yaml.txt');
    // "outputs: [html, pdf" on line 3 never closes; the parser finds out at "series:", line 4 column 1.
    expect(lines).toEqual([`${f}:4:1: a [ list is not closed — add the ] where it ends`]);
  });

  it('reports an empty file at its start', () => {
    const { lines, f } = report('empty.yaml');
    expect(lines).toEqual([`${f}:1:1: the job file is empty — start it with brief: (a title) and series: (a list)`]);
  });
});

describe('schema mistakes', () => {
  it('wrong type: text where true or false belongs', () => {
    const { lines, f } = report('wrong-type.yaml');
    // "  pdf_archival: yes please": 2 + 14 characters before the value → column 17.
    expect(lines).toEqual([
      `${f}:3:17: brief.pdf_archival must be true or false, got "yes please" — write pdf_archival: true or pdf_archival: false`,
    ]);
  });

  it('a top level that is not a mapping', () => {
    const { lines, f } = report('not-mapping.yaml');
    expect(lines).toEqual([
      `${f}:1:1: the job file must be a mapping with brief: and series: at the top, got a list of 2 items — start the file with brief: (its title and outputs) and series: (a list of series)`,
    ]);
  });

  it('unknown key, at the key, with the nearest allowed key', () => {
    const { lines, f } = report('unknown-key.yaml');
    // "      seasonl_window: 13": the key starts after 6 spaces → column 7.
    expect(lines).toEqual([
      `${f}:13:7: unknown key "seasonl_window" in series[0].decomposition — did you mean "seasonal_window"?`,
    ]);
  });

  it('missing required key, at the mapping that lacks it', () => {
    const { lines, f } = report('missing-key.yaml');
    // The data mapping starts with "      file:" on line 8, column 7.
    expect(lines).toEqual([
      `${f}:8:7: series[0].data is missing the required key "value" — add e.g. value: delivered_ml (quote names that look like numbers: value: "2024")`,
    ]);
  });

  it('combine is required in a series when defaults sets none', () => {
    const { lines, f } = report('no-combine.yaml');
    // series[0] is the mapping starting at "id" after "  - ": line 4, column 5.
    expect(lines).toEqual([
      `${f}:4:5: series[0] is missing the required key "combine" — add combine: sum for flows (totals over time) or combine: mean for levels and rates, or set it once under defaults:`,
    ]);
  });

  it('bad enum value, with the allowed value it resembles', () => {
    const { lines, f } = report('bad-enum.yaml');
    // "    combine: summ": 4 + 9 characters before the value → column 14.
    expect(lines).toEqual([`${f}:6:14: series[0].combine must be sum or mean, got "summ" — did you mean "sum"?`]);
  });

  it('bad month for the fiscal year start', () => {
    const { lines, f } = report('bad-month.yaml');
    // "  fiscal_year_start: 13": 2 + 19 characters before the value → column 22.
    expect(lines).toEqual([
      `${f}:4:22: brief.fiscal_year_start must be a whole month number 1–12, got 13 — write e.g. fiscal_year_start: 7 for a July start`,
    ]);
  });

  it('even seasonal window', () => {
    const { lines, f } = report('even-window.yaml');
    // "    decomposition: { seasonal_window: 12 }": 4 + 15 + 2 + 17 = 38 characters before 12 → column 39.
    expect(lines).toEqual([
      `${f}:8:39: series[0].decomposition.seasonal_window must be an odd whole number of at least 7, or periodic, got 12 — use an odd number such as 7, 13 or 23, or periodic`,
    ]);
  });
});

describe('checks beyond the schema', () => {
  it('duplicate series id, at the second use', () => {
    const { lines, f } = report('duplicate-id.yaml');
    // "  - id: deliveries" on line 8: 4 + 4 characters before the id → column 9.
    expect(lines).toEqual([
      `${f}:8:9: series id "deliveries" is used twice, by series[0] and series[1] — give each series an id of its own`,
    ]);
  });

  it('missing data file, with the full path looked for', () => {
    const { lines, f } = report('missing-data.yaml');
    // "      file: data/no-such-file.csv": 6 + 6 characters before the path → column 13.
    const full = resolve(BAD, 'data/no-such-file.csv');
    expect(lines).toEqual([
      `${f}:8:13: data file "data/no-such-file.csv" not found (looked for ${full}) — check the name; relative paths start from the job file's folder`,
    ]);
  });

  it('logo of the wrong kind, templates that are a file, data that is a folder or of an unknown kind', () => {
    const { lines, f } = report('paths.yaml');
    // "  logo: " is 8 characters, "  templates: " 13, "    data: { file: " 18.
    // The third series names a .ods file but says format: csv, which is allowed.
    expect(lines).toEqual([
      `${f}:3:9: logo "../paths/assets/logo.gif" is not a .png, .jpg, .jpeg or .svg file — save the logo as PNG, JPEG or SVG`,
      `${f}:4:14: templates folder "../paths/templates.txt" is a file, not a folder — name the folder that holds the template files`,
      `${f}:9:19: data file "../paths/data/readings.ods" ends in none of .csv, .json, .xlsx, .sqlite, .sqlite3, .db — say which it is with format: csv, json, xlsx or sqlite`,
      `${f}:13:19: data file "../paths/data/folder.csv" is a folder — name the file inside it`,
    ]);
  });

  it('locale that is not a language tag, and one this Node.js does not know', () => {
    const bad = report('locale.yaml');
    // "  locale: " is 10 characters → column 11. "en-GB-x" has a private-use "x" with nothing after it,
    // which BCP 47 forbids (RFC 5646 §2.1).
    expect(bad.lines).toEqual([
      `${bad.f}:3:11: locale "en-GB-x" is not a valid language tag — write a language tag such as en-GB, en-AU, de-DE or fr-CA`,
    ]);
    const unknown = report('locale-unknown.yaml');
    expect(unknown.lines).toEqual([
      `${unknown.f}:3:11: locale "zz" is not known to this Node.js — write a language tag such as en-GB, en-AU, de-DE or fr-CA`,
    ]);
  });

  it('decomposition settings that contradict each other, told once each even when set in defaults', () => {
    const { lines, f } = report('decomposition.yaml');
    // Line 5 "  decomposition: { periods: [168, 24] }": the key periods starts at 2 + 15 + 2 + 1 = column 20,
    // 24 at column 35. series[0] and series[2] use stl, so defaults' periods trouble both.
    expect(lines).toEqual([
      `${f}:5:20: periods is only used with method: mstl (not by series[0], series[2]) — add method: mstl for several seasonal cycles, or give one cycle as period:`,
      `${f}:5:35: periods must be in ascending order, but 24 follows 168 — write periods: [24, 168]`,
      `${f}:15:7: period is not used with method: mstl (series[1]) — list every seasonal cycle under periods: instead`,
      `${f}:16:24: 3 seasonal windows are listed for 2 periods (series[1]) — give one window per period, in the same order, or a single window for all`,
      `${f}:22:24: a list of seasonal windows is only used with method: mstl (not by series[2]) — give one window such as seasonal_window: 13, or use method: mstl`,
      `${f}:23:21: series[2].decomposition.trend_window must be an odd whole number of at least 3, got 20 — use an odd number such as 19 or 23`,
      `${f}:24:18: series[2].decomposition.henderson must be an odd whole number of at least 3, or false, got true — use a length such as 13 or 23, or henderson: false`,
    ]);
  });

  it('mstl without periods is allowed (they come from the frequency), a window below 7 is not', () => {
    const { lines, f } = report('mstl-no-periods.yaml');
    // "    decomposition: { method: mstl, seasonal_window: 4 }": 4 at 4 + 15 + 2 + 8 + 6 + 17 = column 53.
    expect(lines).toEqual([
      `${f}:8:53: series[0].decomposition.seasonal_window must be an odd whole number of at least 7, or periodic, got 4 — use an odd number such as 7, 13 or 23, or periodic`,
    ]);
  });

  it('comparison spans: reversed is an error, unequal lengths are not; periods must exist', () => {
    const { lines, f } = report('comparisons.yaml');
    // Line 10 "  - { custom: { label: Winter, current: [": the [ is at 4 + 2 + 8 + 2 + 15 + 9 + 1 = column 41.
    // Line 11 compares 3 months with 6: allowed. Line 12: 2026 has 53 ISO weeks (it starts on a Thursday),
    // 2025 has 52 (it starts on a Wednesday), so 2025-W53 does not exist (ISO 8601 week rule).
    expect(lines).toEqual([
      `${f}:3:11: brief.period is "2026-02-30", which is not a date in the calendar — check the day of the month, or the week number of that year`,
      `${f}:10:41: comparisons[0].custom.current runs backwards: 2026-02 comes after 2025-12 — write the earlier period first: [2025-12, 2026-02]`,
      `${f}:12:40: comparisons[2].custom.current runs backwards: 2026-W53 comes after 2026-W52 — write the earlier period first: [2026-W52, 2026-W53]`,
      `${f}:12:73: comparisons[2].custom.baseline[0] is "2025-W53", which is not a date in the calendar — check the day of the month, or the week number of that year`,
      `${f}:13:21: comparisons[3].year_to_date is missing the required key "label" — add e.g. label: Same month last year`,
      `${f}:13:23: unknown key "lable" in comparisons[3].year_to_date — did you mean "label"?`,
      `${f}:14:40: comparisons[4].custom.current must be a list of two periods [first, last], got a list of 1 item — write e.g. [2025-12, 2026-02]`,
    ]);
  });
});

describe('several mistakes in one file', () => {
  it('reports all three, in file order, as one BriefErrors', () => {
    const { lines, f, error } = report('three-errors.yaml');
    expect(error).toBeInstanceOf(BriefErrors);
    expect((error as BriefErrors).errors.map((e) => e.code)).toEqual([
      'job-bad-value',
      'job-data-file',
      'job-unknown-key',
    ]);
    const full = resolve(BAD, '../minimal/data/no-such-file.csv');
    // "  page_size: A3": 2 + 11 → column 14; "      file: " 12 → column 13; "      delimeter" key → column 7.
    expect(lines).toEqual([
      `${f}:3:14: brief.page_size must be A4 or Letter, got "A3" — did you mean "A4"?`,
      `${f}:9:13: data file "../minimal/data/no-such-file.csv" not found (looked for ${full}) — check the name; relative paths start from the job file's folder`,
      `${f}:12:7: unknown key "delimeter" in series[0].data — did you mean "delimiter"?`,
    ]);
  });

  it('every error carries the file, line and column as separate fields', () => {
    const { error, f } = report('three-errors.yaml');
    expect((error as BriefErrors).errors.map((e) => e.place)).toEqual([
      { file: f, line: 3, column: 14 },
      { file: f, line: 9, column: 13 },
      { file: f, line: 12, column: 7 },
    ]);
    expect(error.exitCode).toBe(2);
  });
});
