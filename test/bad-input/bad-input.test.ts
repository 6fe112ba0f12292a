/**
 * Bad input through the real command line (dist/, in a child process): one fixture folder per case under
 * test/bad-input/cases/, each the good job of test/bad-input/good/ (72 invented months,
 * 200 + 1.5·t + 25·sin(2π·month/12) plus a small repeating wobble) with one thing broken.
 *
 * For every case, the project's rule (DEVELOPERS.md: "The CLI prints one line and exits 2 for bad input …
 * Nothing is written on failure"):
 *   - exit code 2, nothing on stdout;
 *   - stderr is exactly one line (three for the job with three mistakes: one line per mistake is the design);
 *   - the line starts with the place: the job file and line:column of the offending text, or the data file
 *     and its row (and column), found here by searching the fixture for that text, not taken from the code;
 *   - after the place, what is wrong, then " — " and a fix; no stack trace;
 *   - nothing is written in --out: the folder already holds the good job's html, pdf and json, and after
 *     the failing run it holds exactly those files (no new file, no temporary dotfile), with the same bytes
 *     and the same modification time.
 * Positive controls (a byte-order mark, gaps, "NaN" as a missing value) must render with exit 0.
 */
import { spawnSync } from 'node:child_process';
import {
  chmodSync,
  cpSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  symlinkSync,
  utimesSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BIN, ROOT, type RunResult, runCli } from '../cli/run.js';

const CASES = fileURLToPath(new URL('./cases/', import.meta.url));
const GOOD = fileURLToPath(new URL('./good/job.yaml', import.meta.url));
const FORMATS = 'html,pdf,json';
const STEM = 'hardening-sample';
/** The time the earlier outputs are dated to, so an overwrite would show. */
const EARLIER = new Date('2020-01-01T00:00:00Z');

interface Ctx {
  /** The case's folder, copied to a temporary place. */
  dir: string;
  /** The job file there (job.yaml, or job.yaml.txt for YAML the formatter cannot parse). */
  job: string;
  out: string;
}

interface Line {
  /** The exact start of the line: the place, then ": ". */
  at: (ctx: Ctx) => string;
  /** What is wrong (between the place and " — "). */
  says: RegExp;
  /** The fix (after " — "). */
  fix: RegExp;
}

interface Case extends Line {
  name: string;
  command?: 'render' | 'check' | 'decompose';
  /** Makes what git cannot hold: a pipe, a link, a file without permissions, a file in place of --out. */
  setup?: (ctx: Ctx) => void;
  /** Further lines, for the job with several mistakes. */
  more?: Line[];
}

// ---- Places, found in the fixture itself --------------------------------------------------------------

function lineAndColumn(text: string, needle: string): [number, number] {
  const lines = text.split('\n');
  const i = lines.findIndex((l) => l.includes(needle));
  if (i < 0) throw new Error(`fixture has no "${needle}"`);
  return [i + 1, lines[i].indexOf(needle) + 1];
}

/** `job:LINE:COL: ` of the first occurrence of `needle` in the job file. */
const jobAt =
  (needle: string) =>
  (ctx: Ctx): string => {
    const [line, col] = lineAndColumn(readFileSync(ctx.job, 'utf8'), needle);
    return `${ctx.job}:${line}:${col}: `;
  };

/** `data/values.csv: row N[, column "C"]: ` where N is the line of the data file holding `needle`. */
const dataRow =
  (needle: string, column?: string, file = 'data/values.csv') =>
  (ctx: Ctx): string => {
    const [line] = lineAndColumn(readFileSync(join(ctx.dir, file), 'utf8'), needle);
    return `${file}: row ${line}${column === undefined ? '' : `, column "${column}"`}: `;
  };

/** `data/values.csv: row N, column "month": ` for the second of the two lines that start with `prefix`. */
const secondRowOf =
  (prefix: string) =>
  (ctx: Ctx): string => {
    const lines = readFileSync(join(ctx.dir, 'data/values.csv'), 'utf8').split('\n');
    const rows = lines.flatMap((l, i) => (l.startsWith(prefix) ? [i + 1] : []));
    expect(rows).toHaveLength(2);
    return `data/values.csv: row ${rows[1]}, column "month": `;
  };

const fileOnly =
  (path: (ctx: Ctx) => string) =>
  (ctx: Ctx): string =>
    `${path(ctx)}: `;

/** `shown:LINE[:COL]: ` of the first byte ≥ 0x80 in `file` (the fixture's one non-UTF-8 byte), counted in bytes. */
const firstHighByte =
  (file: (ctx: Ctx) => string, shown: (ctx: Ctx) => string, withColumn: boolean) =>
  (ctx: Ctx): string => {
    const bytes = readFileSync(file(ctx));
    const at = bytes.findIndex((b) => b >= 0x80);
    const before = bytes.subarray(0, at);
    const line = before.filter((b) => b === 10).length + 1;
    const col = at - (before.lastIndexOf(10) + 1) + 1;
    return `${shown(ctx)}:${line}${withColumn ? `:${col}` : ''}: `;
  };

// ---- The cases -------------------------------------------------------------------------------------------

const IS_ROOT = process.getuid?.() === 0;

const TABLE: Case[] = [
  // YAML syntax
  {
    name: 'yaml-bad-indentation',
    // "   organisation:" is one space deeper than "title:", so the title's value runs on into it.
    at: jobAt('Hardening sample'),
    says: /^a value runs on into a line that holds a key$/,
    fix: /indentation/,
  },
  {
    name: 'yaml-list-item-indented-too-little',
    // "   unit:" is one space short of the list item's keys.
    at: (ctx) => `${ctx.job}:${lineAndColumn(readFileSync(ctx.job, 'utf8'), '   unit: units')[0]}:1: `,
    says: /indented less than the keys above it/,
    fix: /indent it by the same number of spaces/,
  },
  {
    name: 'yaml-unclosed-bracket',
    // "outputs: [html, pdf" never closes; the parser finds out where "series:" begins.
    at: jobAt('series:'),
    says: /^a \[ list is not closed$/,
    fix: /add the \] where it ends/,
  },
  {
    name: 'yaml-tab-indentation',
    at: (ctx) => `${ctx.job}:${lineAndColumn(readFileSync(ctx.job, 'utf8'), '\torganisation')[0]}:1: `,
    says: /^a tab is used to indent$/,
    fix: /spaces only/,
  },
  {
    name: 'yaml-duplicate-key',
    at: jobAt('title: Another title'),
    says: /appears twice/,
    fix: /keep one of them/,
  },
  {
    name: 'yaml-alias-without-anchor',
    command: 'check',
    at: jobAt('*measure'),
    says: /^the alias \*measure names no anchor$/,
    fix: /define the anchor/,
  },
  {
    name: 'yaml-alias-bomb',
    command: 'check',
    // Four levels of ten aliases each would make 10⁴ copies; the loader stops at the first alias.
    at: jobAt('*x0'),
    says: /aliases .* too many times/,
    fix: /write the values out/,
  },
  {
    name: 'job-not-utf8',
    at: firstHighByte(
      (ctx) => ctx.job,
      (ctx) => ctx.job,
      true,
    ),
    says: /is not UTF-8 text$/,
    fix: /save the job file as UTF-8/,
  },
  {
    name: 'job-empty',
    at: (ctx) => `${ctx.job}:1:1: `,
    says: /^the job file is empty$/,
    fix: /brief:.*series:/,
  },
  // The schema, one mistake each
  {
    name: 'type-fiscal-year-as-text',
    at: jobAt('July'),
    says: /^brief\.fiscal_year_start must be a whole month number 1–12, got "July"$/,
    fix: /fiscal_year_start: 7/,
  },
  {
    name: 'type-outputs-not-a-list',
    at: jobAt('html'),
    says: /^brief\.outputs must be a list .*, got "html"$/,
    fix: /outputs: \[html, pdf\]/,
  },
  {
    name: 'type-firmness-periods-as-text',
    at: jobAt('many'),
    says: /^series\[0\]\.firmness\.periods must be a whole number 4–120, got "many"$/,
    fix: /periods: 24/,
  },
  {
    name: 'type-title-as-list',
    at: jobAt('[Hardening, sample]'),
    says: /^brief\.title must be text, got a list of 2 items$/,
    fix: /title:/,
  },
  {
    name: 'unknown-key-organization',
    at: jobAt('organization'),
    says: /^unknown key "organization" in brief$/,
    fix: /^did you mean "organisation"\?$/,
  },
  {
    name: 'unknown-key-units',
    at: jobAt('units: units'),
    says: /^unknown key "units" in series\[0\]$/,
    fix: /^did you mean "unit"\?$/,
  },
  {
    name: 'missing-key-title',
    // A missing key is reported at the mapping that lacks it: brief's first key.
    at: jobAt('organisation: Test bench'),
    says: /^brief is missing the required key "title"$/,
    fix: /add e\.g\. title:/,
  },
  {
    name: 'missing-key-date',
    at: jobAt('file: data/values.csv'),
    says: /^series\[0\]\.data is missing the required key "date"$/,
    fix: /add e\.g\. date:/,
  },
  {
    name: 'bad-enum-combine',
    at: jobAt('total'),
    says: /^series\[0\]\.combine must be sum or mean, got "total"$/,
    fix: /combine: sum/,
  },
  {
    name: 'bad-month-13',
    at: jobAt('13'),
    says: /^brief\.fiscal_year_start must be a whole month number 1–12, got 13$/,
    fix: /fiscal_year_start: 7/,
  },
  {
    name: 'bad-colour',
    at: jobAt('"#12345G"'),
    says: /^brief\.accent must be a colour written #rrggbb, got "#12345G"$/,
    fix: /accent: "#/,
  },
  {
    name: 'bad-colour-unquoted',
    // YAML reads "#0B6E8C" without quotes as a comment: the key has no value. The place is the key's line,
    // just after "accent: " (the empty value).
    at: (ctx) => {
      const [line, col] = lineAndColumn(readFileSync(ctx.job, 'utf8'), 'accent: ');
      return `${ctx.job}:${line}:${col + 'accent: '.length}: `;
    },
    says: /^brief\.accent must be a colour written #rrggbb, got nothing$/,
    fix: /in quotes: YAML reads # as the start of a comment/,
  },
  {
    name: 'three-mistakes',
    at: jobAt('organization'),
    says: /^unknown key "organization" in brief$/,
    fix: /did you mean "organisation"/,
    more: [
      { at: jobAt('total'), says: /combine must be sum or mean, got "total"/, fix: /combine: sum/ },
      { at: jobAt('file: data/values.csv'), says: /missing the required key "date"/, fix: /add e\.g\. date:/ },
    ],
  },
  // Paths
  {
    name: 'data-file-missing',
    at: jobAt('data/nothing.csv'),
    says: /^data file "data\/nothing\.csv" not found \(looked for .*\/data\/nothing\.csv\)$/,
    fix: /relative paths start from the job file's folder/,
  },
  {
    name: 'data-file-is-a-folder',
    at: jobAt('data/folder.csv'),
    says: /^data file "data\/folder\.csv" is a folder$/,
    fix: /name the file inside it/,
  },
  {
    name: 'data-file-is-a-pipe',
    // A named pipe nobody writes to: reading it would wait forever.
    setup: (ctx) => {
      mkdirSync(join(ctx.dir, 'data'), { recursive: true });
      expect(spawnSync('mkfifo', [join(ctx.dir, 'data', 'pipe.csv')]).status).toBe(0);
    },
    at: jobAt('data/pipe.csv'),
    says: /^data file "data\/pipe\.csv" is not a regular file/,
    fix: /ordinary file/,
  },
  {
    name: 'data-file-dangling-link',
    setup: (ctx) => {
      mkdirSync(join(ctx.dir, 'data'), { recursive: true });
      symlinkSync('/nonexistent/trendbrief/values.csv', join(ctx.dir, 'data', 'link.csv'));
    },
    at: jobAt('data/link.csv'),
    says: /^data file "data\/link\.csv" not found/,
    fix: /check the name/,
  },
  {
    name: 'data-file-unreadable',
    // No read permission. Root reads any file, so as root the command runs as user "nobody" (see run()).
    setup: (ctx) => chmodSync(join(ctx.dir, 'data', 'locked.csv'), 0o000),
    at: fileOnly(() => 'data/locked.csv'),
    says: /^the data file cannot be read \(EACCES\)$/,
    fix: /permissions/,
  },
  {
    name: 'data-path-outside-missing',
    at: jobAt('../elsewhere/values.csv'),
    says: /^data file "\.\.\/elsewhere\/values\.csv" not found \(looked for .*\/elsewhere\/values\.csv\)$/,
    fix: /relative paths start from the job file's folder/,
  },
  {
    name: 'logo-missing',
    at: jobAt('assets/logo.png'),
    says: /^logo "assets\/logo\.png" not found/,
    fix: /check the name/,
  },
  {
    name: 'logo-not-an-image',
    // The name ends in .png but the bytes are text: the type is read from the bytes.
    at: fileOnly((ctx) => join(ctx.dir, 'assets', 'logo.png')),
    says: /is not a PNG, JPEG or SVG image$/,
    fix: /convert it to PNG or SVG, or remove brief\.logo/,
  },
  // CSV content
  { name: 'csv-empty', at: fileOnly(() => 'data/values.csv'), says: /^the file is empty$/, fix: /header row/ },
  {
    name: 'csv-header-only',
    at: dataRow('month,value'),
    says: /^the file has a header but no data rows$/,
    fix: /add the data rows/,
  },
  {
    name: 'csv-semicolons',
    at: dataRow('month;value'),
    says: /^only one column was found, with fields separated by ",", but the header contains ";"$/,
    fix: /^set the data delimiter to ";" in the job$/,
  },
  {
    name: 'csv-quoted-semicolons',
    at: dataRow('"month";"value"'),
    says: /^the quoted fields of the header are separated by ";", not by ","$/,
    fix: /^set the data delimiter to ";" in the job$/,
  },
  {
    name: 'csv-mixed-date-formats',
    // Row 11 writes a day (2019-10-01) among months; row 2 is the first date, a month.
    at: dataRow('2019-10-01', 'month'),
    says: /^"2019-10-01" is a date like 2024-03-05, but row 2 has "2019-01", a month like 2024-03$/,
    fix: /same format/,
  },
  {
    name: 'csv-impossible-date',
    // 2021 is not a leap year: February has 28 days.
    at: dataRow('2021-02-30', 'date'),
    says: /^"2021-02-30" is not a real date: 2021-02 has 28 days \(not a leap year\)$/,
    fix: /check the day and the month/,
  },
  {
    name: 'csv-month-13',
    at: dataRow('2019-13', 'month'),
    says: /^"2019-13" has no month 13$/,
    fix: /months run from 01 to 12/,
  },
  {
    name: 'csv-duplicate-date',
    // 2019-09 is on two rows; the second is the one reported.
    at: secondRowOf('2019-09,'),
    says: /^row \d+ and row \d+ both fall in monthly period 2019-09/,
    fix: /aggregate the rows to one per period/,
  },
  { name: 'csv-text-in-number', at: dataRow('12a', 'value'), says: /^"12a" is not a number$/, fix: /plain numbers/ },
  {
    name: 'csv-infinity',
    at: dataRow('Infinity', 'value'),
    says: /^"Infinity" is not a finite number$/,
    fix: /leave the cell empty or write NA/,
  },
  {
    name: 'csv-huge-value',
    at: dataRow('1e300', 'value'),
    says: /^"1e300" is too large to be a value/,
    fix: /identifiers or dates/,
  },
  {
    name: 'csv-binary-png',
    // A PNG renamed .csv: the place is the line (count of newline bytes + 1) of its first NUL byte.
    at: (ctx) => {
      const bytes = readFileSync(join(ctx.dir, 'data/values.csv'));
      const line = bytes.subarray(0, bytes.indexOf(0)).filter((b) => b === 10).length + 1;
      return `data/values.csv:${line}: `;
    },
    says: /NUL bytes, so it is not a text file/,
    fix: /export the data as CSV/,
  },
  {
    name: 'csv-ragged-row',
    at: dataRow(',7'),
    says: /^this row has 3 fields but the header has 2$/,
    fix: /delimiter/,
  },
  {
    name: 'csv-not-utf8',
    at: firstHighByte(
      (ctx) => join(ctx.dir, 'data/values.csv'),
      () => 'data/values.csv',
      false,
    ),
    says: /^byte 0xE9 is not valid UTF-8 text$/,
    fix: /Latin-1/,
  },
  {
    name: 'csv-column-misspelt',
    at: dataRow('month,value', 'valeu'),
    says: /^there is no value column "valeu"; columns found: "month", "value"$/,
    fix: /did you mean "value"\?/,
  },
  {
    name: 'json-syntax',
    // A trailing comma before the closing "]": the place is the "]" itself.
    at: (ctx) => {
      const text = readFileSync(join(ctx.dir, 'data/values.txt'), 'utf8');
      const lines = text.split('\n');
      const line = lines.lastIndexOf(']') + 1;
      expect(lines[line - 2].endsWith(',')).toBe(true);
      return `data/values.txt:${line}:1: `;
    },
    says: /^the file is not valid JSON: Unexpected token '\]'$/,
    fix: /trailing comma/,
  },
  // Settings the data cannot support
  {
    name: 'period-longer-than-data',
    at: jobAt('48'),
    says: /^72 values are fewer than two full cycles of period 48 \(a seasonal method needs at least 96\)$/,
    fix: /shorter period/,
  },
  {
    name: 'seasonal-window-even',
    at: jobAt('12'),
    says: /seasonal_window must be an odd whole number of at least 7, or periodic, got 12$/,
    fix: /odd number/,
  },
  {
    name: 'extend-out-of-range',
    at: jobAt('1001'),
    says: /extend must be auto, on, off, or a whole number of periods from 1 to 1000, got 1001$/,
    fix: /extend: 12 for a year of monthly forecasts/,
  },
  {
    name: 'extend-unknown-word',
    at: jobAt('sometimes'),
    says: /extend must be auto, on, off, or a whole number of periods from 1 to 1000, got "sometimes"$/,
    fix: /extend: auto, extend: off/,
  },
  {
    name: 'extend-longer-than-data',
    at: jobAt('100'),
    says: /^extend: 100 asks for more forecasts than the series has values \(72\)$/,
    fix: /use at most 72, or extend: on for 12/,
  },
  {
    name: 'multiplicative-with-zero',
    at: jobAt('multiplicative'),
    says: /^a multiplicative model needs every value above zero/,
    fix: /model: additive/,
  },
  {
    name: 'reporting-period-after-data',
    at: jobAt('2026-03'),
    says: /^the reporting period 2026-03 is outside the data of series "sample" \(2019-01-01 to 2024-12-01\)$/,
    fix: /choose a period within the data/,
  },
  {
    name: 'reporting-period-under-two-years',
    // 2019-01 to 2020-06 is 18 months; a brief needs two cycles of 12 and one month more, 25 in all.
    at: jobAt('2020-06'),
    says: /^series "sample" has 18 months of data up to the reporting period; a brief of monthly data needs at least 25: two whole cycles of the seasonal period of 12 months, and one month more for the test of a real seasonal pattern$/,
    fix: /later reporting period/,
  },
  {
    name: 'reporting-period-not-a-date',
    at: jobAt('2024-02-30'),
    says: /^brief\.period is "2024-02-30", which is not a date in the calendar$/,
    fix: /day of the month/,
  },
  // Template overrides
  {
    name: 'template-missing-partial',
    at: (ctx) => {
      const file = join(ctx.dir, 'my-templates/partials/masthead.hbs');
      const [line, col] = lineAndColumn(readFileSync(file, 'utf8'), '{{> letterhead}}');
      return `${file}:${line}:${col}: `;
    },
    says: /^the partial "letterhead" is not found$/,
    fix: /add partials\/letterhead\.hbs/,
  },
  {
    name: 'template-unknown-helper',
    at: (ctx) => {
      const file = join(ctx.dir, 'my-templates/partials/masthead.hbs');
      const [line, col] = lineAndColumn(readFileSync(file, 'utf8'), '{{shout title}}');
      return `${file}:${line}:${col}: `;
    },
    says: /^unknown helper "shout"$/,
    fix: /the helpers available are/,
  },
  {
    name: 'template-unclosed-block',
    // The parser finds out at the end of the file: the line after the last newline.
    at: (ctx) => {
      const file = join(ctx.dir, 'my-templates/partials/masthead.hbs');
      return `${file}:${readFileSync(file, 'utf8').split('\n').length}: `;
    },
    says: /never closed/,
    fix: /closed by the matching/,
  },
  // Hostile text: control characters, huge text, deep nesting, header injection, template helpers
  {
    name: 'job-control-character',
    // YAML's "\0" escape writes a NUL byte into the title; it would be copied raw into the HTML.
    at: jobAt('"Hardening\\0sample"'),
    says: /^brief\.title holds the control character U\+0000, which is not text$/,
    fix: /remove it/,
  },
  {
    name: 'label-huge',
    // A label of a million characters (about 1 MB): once "Maximum call stack size exceeded" in the PDF.
    setup: (ctx) => {
      const label = 'abcd efg'.repeat(131_072);
      writeFileSync(ctx.job, readFileSync(ctx.job, 'utf8').replace('LABEL-WRITTEN-BY-SETUP', label));
    },
    at: jobAt('abcd efgabcd'),
    says: /^series\[0\]\.label is 1,048,576 characters long, more than the 1,000 a brief can show$/,
    fix: /shorten it/,
  },
  {
    name: 'yaml-deep-nesting',
    // Lists nested 3,000 levels: once a stack overflow, reported at no place. The top-level mapping and that
    // of defaults are two levels; the 63rd "[" opens the 65th, one more than a job may nest.
    setup: (ctx) => {
      const deep = `${'['.repeat(3000)}${']'.repeat(3000)}`;
      writeFileSync(ctx.job, readFileSync(ctx.job, 'utf8').replace('NESTING-WRITTEN-BY-SETUP', deep));
    },
    at: (ctx) => {
      const [line, col] = lineAndColumn(readFileSync(ctx.job, 'utf8'), '[[[');
      return `${ctx.job}:${line}:${col + 62}: `;
    },
    says: /^the lists and mappings are nested more than 64 levels deep$/,
    fix: /never closed/,
  },
  {
    name: 'email-address-line-break',
    // A display name holding CR LF would end the To header and start a Bcc of its own (RFC 5322 §2.2).
    at: jobAt('"Ops'),
    says: /^brief\.email\.to\[0\] must be an email address, got "Ops\\r\\nBcc: hidden@example\.org <ops@example\.org>"$/,
    fix: /Name <name@domain>/,
  },
  {
    name: 'template-log-helper',
    // handlebars' own log helper would write to stdout, where a command's results go.
    at: (ctx) => {
      const file = join(ctx.dir, 'my-templates/partials/masthead.hbs');
      const [line, col] = lineAndColumn(readFileSync(file, 'utf8'), '{{log');
      return `${file}:${line}:${col}: `;
    },
    says: /^unknown helper "log"$/,
    fix: /the helpers available are/,
  },
  {
    name: 'template-css-escape',
    // "u\72l(" is url( once the escape is undone (CSS Syntax Level 3, §4.3.7): Chromium fetches it.
    at: (ctx) => {
      const file = join(ctx.dir, 'my-templates/brief.css');
      const [line, col] = lineAndColumn(readFileSync(file, 'utf8'), 'u\\72l(');
      return `${file}:${line}:${col}: `;
    },
    says: /^the stylesheet refers to a file or address (with url\(…\)|in text it cannot read as CSS); the brief must stay one self-contained file$/,
    fix: /data: URI/,
  },
  // An output folder that cannot be made: a file stands in its place.
  {
    name: 'out-folder-is-a-file',
    setup: (ctx) => {
      rmSync(ctx.out, { recursive: true });
      writeFileSync(ctx.out, 'a file where the output folder should be\n');
      utimesSync(ctx.out, EARLIER, EARLIER);
    },
    at: fileOnly((ctx) => ctx.out),
    says: /^cannot create the output folder .*: EEXIST$/,
    fix: /writable folder with --out/,
  },
  // The decompose command on a broken data file (it prints to stdout; nothing may be printed).
  {
    name: 'decompose-ragged-row',
    command: 'decompose',
    at: dataRow(',7'),
    says: /^this row has 3 fields but the header has 2$/,
    fix: /delimiter/,
  },
  {
    name: 'decompose-duplicate-date',
    command: 'decompose',
    at: secondRowOf('2019-09,'),
    says: /both fall in monthly period 2019-09/,
    fix: /aggregate/,
  },
];

// ---- Running a case ------------------------------------------------------------------------------------

let earlier: Map<string, Buffer>;
const temps: string[] = [];

beforeAll(() => {
  // The outputs of an earlier, successful run: they must survive every failing run byte for byte.
  const out = mkdtempSync(join(tmpdir(), 'tb-bad-good-'));
  temps.push(out);
  const r = runCli(['render', GOOD, '--out', out, '--format', FORMATS]);
  expect(r.code, r.stderr).toBe(0);
  earlier = new Map(readdirSync(out).map((f) => [f, readFileSync(join(out, f))]));
  expect([...earlier.keys()].sort()).toEqual([`${STEM}.html`, `${STEM}.json`, `${STEM}.pdf`]);
}, 120_000);

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

function prepare(name: string): Ctx {
  const root = mkdtempSync(join(tmpdir(), `tb-bad-${name}-`));
  temps.push(root);
  const dir = join(root, 'case');
  cpSync(join(CASES, name), dir, { recursive: true });
  const job = ['job.yaml', 'job.yaml.txt'].map((f) => join(dir, f)).find((f) => existsSync(f)) ?? join(dir, 'job.yaml');
  const out = join(root, 'out');
  mkdirSync(out);
  for (const [f, bytes] of earlier) {
    writeFileSync(join(out, f), bytes);
    utimesSync(join(out, f), EARLIER, EARLIER);
  }
  return { dir, job, out };
}

/** What --out holds (every name, dotfiles too) with bytes and modification times; a file if it is one. */
function snapshot(out: string): Map<string, { bytes: Buffer; mtimeMs: number }> {
  const paths = statSync(out).isDirectory() ? readdirSync(out).map((f) => join(out, f)) : [out];
  return new Map(paths.map((p) => [p, { bytes: readFileSync(p), mtimeMs: statSync(p).mtimeMs }]));
}

const NOBODY = 65534;

/** Whether user "nobody" can run the built command line from here (to test permissions as root). */
function nobodyCanRun(): boolean {
  const r = spawnSync(process.execPath, [BIN, '--version'], { cwd: ROOT, uid: NOBODY, gid: NOBODY });
  return r.status === 0;
}

function run(c: Case, ctx: Ctx): RunResult {
  const args =
    c.command === 'decompose'
      ? ['decompose', 'data/values.csv', '--date', 'month', '--value', 'value']
      : c.command === 'check'
        ? ['check', ctx.job, '--out', ctx.out]
        : ['render', ctx.job, '--out', ctx.out, '--format', FORMATS];
  const cwd = c.command === 'decompose' ? ctx.dir : ROOT;
  if (c.name === 'data-file-unreadable' && IS_ROOT) {
    chmodSync(join(ctx.dir, '..'), 0o755);
    const r = spawnSync(process.execPath, [BIN, ...args], {
      cwd,
      env: { ...process.env, NO_COLOR: '1' },
      encoding: 'utf8',
      uid: NOBODY,
      gid: NOBODY,
    });
    return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
  }
  return runCli(args, {}, cwd);
}

function expectLine(line: string, expected: Line, ctx: Ctx): void {
  const place = expected.at(ctx);
  expect(line.slice(0, place.length)).toBe(place);
  const rest = line.slice(place.length);
  const dash = rest.indexOf(' — ');
  expect(dash, `no " — " before a fix in: ${line}`).toBeGreaterThan(0);
  expect(rest.slice(0, dash)).toMatch(expected.says);
  expect(rest.slice(dash + 3)).toMatch(expected.fix);
}

describe('bad input: one located line, exit 2, nothing written', () => {
  it('has a fixture folder for every case and a case for every fixture folder', () => {
    expect(TABLE.length).toBeGreaterThanOrEqual(40);
    const controls = CONTROLS.map((c) => c.name);
    expect(readdirSync(CASES).sort()).toEqual([...TABLE.map((c) => c.name), ...controls].sort());
  });

  const rootWithoutNobody = IS_ROOT && !nobodyCanRun();
  for (const c of TABLE) {
    const skip = c.name === 'data-file-unreadable' && rootWithoutNobody;
    // As root without a usable "nobody", a file without permissions is still readable: nothing to test.
    it.skipIf(skip)(c.name, () => {
      const ctx = prepare(c.name);
      c.setup?.(ctx);
      const before = snapshot(ctx.out);
      const r = run(c, ctx);
      expect(r.code, r.stderr).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).not.toContain('\n    at ');
      expect(r.stderr.endsWith('\n')).toBe(true);
      const lines = r.stderr.slice(0, -1).split('\n');
      const expected = [c, ...(c.more ?? [])];
      expect(lines).toHaveLength(expected.length);
      for (const [i, line] of lines.entries()) expectLine(line, expected[i], ctx);
      // Earlier outputs: the same names (no new file, no temporary file), bytes and times.
      const after = snapshot(ctx.out);
      expect([...after.keys()].sort()).toEqual([...before.keys()].sort());
      for (const [p, b] of before) {
        expect(after.get(p)?.bytes.equals(b.bytes), p).toBe(true);
        expect(after.get(p)?.mtimeMs, p).toBe(b.mtimeMs);
      }
    });
  }
});

// ---- Positive controls ---------------------------------------------------------------------------------

interface Control {
  name: string;
  /** Checks on the written brief (its JSON and HTML) against the fixture. */
  check: (brief: BriefJson, html: string, ctx: Ctx) => void;
}

interface BriefJson {
  series: { data: { gaps: string[]; notes: string[] }; components: { dates: string[] } }[];
}

/** The months of a month,value CSV, as the brief's ISO dates (YYYY-MM-01). */
function monthsOf(csv: string): string[] {
  return csv
    .replace(/^\uFEFF/, '')
    .split('\n')
    .slice(1)
    .filter((l) => l.trim() !== '')
    .map((l) => `${l.split(',')[0]}-01`);
}

/** Every month from the first to the last listed, by counting (no date library). */
function monthRange(first: string, last: string): string[] {
  const out: string[] = [];
  let [y, m] = first.split('-').map(Number);
  const [ly, lm] = last.split('-').map(Number);
  while (y < ly || (y === ly && m <= lm)) {
    out.push(`${y}-${String(m).padStart(2, '0')}-01`);
    m = m === 12 ? 1 : m + 1;
    if (m === 1) y++;
  }
  return out;
}

const CONTROLS: Control[] = [
  {
    // A byte-order mark before the header is valid UTF-8 CSV (spreadsheets write it): it must not end up in
    // the first column's name.
    name: 'csv-byte-order-mark',
    check: (brief, _html, ctx) => {
      const csv = readFileSync(join(ctx.dir, 'data/values.csv'), 'utf8');
      expect(csv.charCodeAt(0)).toBe(0xfeff);
      expect(brief.series[0].components.dates).toEqual(monthsOf(csv));
      expect(brief.series[0].data.gaps).toEqual([]);
    },
  },
  {
    // Three months have no row: the brief renders, lists them as gaps and says so in a note.
    name: 'csv-gaps',
    check: (brief, html, ctx) => {
      const present = monthsOf(readFileSync(join(ctx.dir, 'data/values.csv'), 'utf8'));
      const all = monthRange(present[0].slice(0, 7), present[present.length - 1].slice(0, 7));
      const missing = all.filter((d) => !present.includes(d));
      expect(missing).toHaveLength(3);
      expect(brief.series[0].components.dates).toEqual(all);
      expect(brief.series[0].data.gaps).toEqual(missing);
      expect(brief.series[0].data.notes).toContain('3 periods had no row and are treated as missing');
      expect(html).toContain('3 periods had no row and are treated as missing');
    },
  },
  {
    // "NaN" in a value cell is one of the spellings of a missing value (src/data/numbers.ts), like NA.
    name: 'csv-nan-is-missing',
    check: (brief, html, ctx) => {
      const lines = readFileSync(join(ctx.dir, 'data/values.csv'), 'utf8').split('\n');
      const month = lines.find((l) => l.endsWith(',NaN'))?.split(',')[0];
      expect(brief.series[0].data.gaps).toEqual([`${month}-01`]);
      expect(html).toContain('1 row had an empty or NA value, treated as missing');
    },
  },
];

describe('positive controls render (exit 0)', () => {
  for (const c of CONTROLS) {
    it(c.name, () => {
      const ctx = prepare(c.name);
      const r = runCli(['render', ctx.job, '--out', ctx.out, '--format', FORMATS]);
      expect(r.code, r.stderr).toBe(0);
      expect(
        r.stderr
          .trim()
          .split('\n')
          .every((l) => l.startsWith('wrote ')),
      ).toBe(true);
      expect(readdirSync(ctx.out).sort()).toEqual([`${STEM}.html`, `${STEM}.json`, `${STEM}.pdf`]);
      const brief = JSON.parse(readFileSync(join(ctx.out, `${STEM}.json`), 'utf8')) as BriefJson;
      c.check(brief, readFileSync(join(ctx.out, `${STEM}.html`), 'utf8'), ctx);
      // The files are new: not the earlier run's.
      expect(statSync(join(ctx.out, `${STEM}.pdf`)).mtimeMs).toBeGreaterThan(EARLIER.getTime());
    });
  }
});
