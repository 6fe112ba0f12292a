/**
 * SQLite sources on real database files written by the sqlite3 command-line program (Debian's sqlite3), read
 * through the real command line: a brief renders with the same figures as from the CSV file the rows came
 * from; filter, group_by and query parameters work; the database is opened read-only and a writer holding
 * its lock does not stop the read, nor does the read leave a lock behind; bad input gets one located line.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { cpSync, readFileSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../cli/run.js';
import { expectBadInput, MONTHS, render, tempDir, writeJob } from './common.js';

const haveSqlite3 = spawnSync('sqlite3', ['-version']).status === 0;
const GOOD_CSV = fileURLToPath(new URL('../bad-input/good/data/values.csv', import.meta.url));

function sqlite(db: string, sql: string): string {
  return execFileSync('sqlite3', [db], { input: sql, encoding: 'utf8' });
}

if (!haveSqlite3) console.warn('SQLite tests skipped: the sqlite3 program is missing (apt-get install sqlite3)');

describe.skipIf(!haveSqlite3)('SQLite sources', () => {
  let dir: string;
  let db: string;
  beforeAll(() => {
    dir = tempDir('sqlite');
    db = join(dir, 'measures.sqlite');
    const rows = MONTHS.map(
      (m) => `('${m.month}-01', 'North', ${m.value}), ('${m.month}-01', 'South', ${m.value * 2})`,
    );
    sqlite(
      db,
      `create table readings (month text, zone text, amount real);
       insert into readings values ${rows.join(',\n')};`,
    );
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('renders a brief with the figures of the CSV file the rows came from', () => {
    const job = writeJob(
      dir,
      `file: measures.sqlite
query: |
  select month, amount
  from readings
  where zone = 'North'
  order by month
date: month
value: amount`,
    );
    const { result, json } = render(job);
    expect(result.code, result.stderr).toBe(0);
    // The brief's data note shows the query on one line (a PDF table cell is one paragraph).
    const html = readFileSync(join(dir, 'out', 'source-sample.html'), 'utf8');
    expect(html).toContain(
      '<dd>select month, amount from readings where zone &#x3D; &#x27;North&#x27; order by month</dd>',
    );
    const csvDir = tempDir('sqlite-csv');
    cpSync(GOOD_CSV, join(csvDir, 'values.csv'));
    const fromCsv = render(writeJob(csvDir, 'file: values.csv\ndate: month\nvalue: value'));
    rmSync(csvDir, { recursive: true, force: true });
    const a = json?.series[0];
    const b = fromCsv.json?.series[0];
    expect(a?.components.observed).toEqual(b?.components.observed);
    expect(a?.components.dates).toEqual(b?.components.dates);
    expect(a?.data.rows).toBe(72);
    expect(a?.data.query).toContain("zone = 'North'");
    expect(a?.data.sha256).toMatch(/^[0-9a-f]{64}$/);
    // The hash is of the query and the rows: not the file's bytes.
    expect(a?.data.sha256).not.toBe(b?.data.sha256);
  });

  it('filters and groups as for a file, and binds the reporting period to ?', () => {
    const job = writeJob(
      dir,
      `file: measures.sqlite
query: select month, zone, amount from readings where month <= ? order by month
parameters: [period_end]
date: month
value: amount
group_by: zone`,
      '  period: 2023-06\n',
    );
    const r = runCli(['check', job]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/brief for North/);
    expect(r.stdout).toMatch(/brief for South/);
    // 2019-01 … 2023-06: 54 months, the last bound by period_end = 2023-06-30.
    expect(r.stdout).toMatch(/54 periods 2019-01-01 to 2023-06-01/);
    // check says what was read: the source, the rows the query returned (both zones) and the periods.
    expect(r.stdout).toMatch(/read measures\.sqlite \(query\): 108 rows, first period 2019-01-01, last 2023-06-01/);
  });

  it('reads while a writer holds the lock, leaves none behind, and never writes the file', async () => {
    const before = readFileSync(db);
    const mtime = statSync(db).mtimeMs;
    // A writer in another process takes the write lock and keeps it for a second and a half.
    const writer = spawnSync(
      'bash',
      [
        '-c',
        `(echo "begin immediate; insert into readings values ('2099-01-01','West',1);"; sleep 1.5; echo "commit;") | sqlite3 ${db} & sleep 0.3; echo started`,
      ],
      { encoding: 'utf8' },
    );
    expect(writer.stdout).toContain('started');
    const job = writeJob(
      dir,
      `file: measures.sqlite\nquery: select month, amount from readings where zone = 'North'\ndate: month\nvalue: amount`,
    );
    const r = runCli(['check', job]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    await new Promise((res) => setTimeout(res, 1600));
    // The writer committed: our read neither blocked it nor was blocked.
    expect(sqlite(db, "select count(*) from readings where zone = 'West';").trim()).toBe('1');
    // And a write right after our read goes through at once (no lock left behind).
    const again = runCli(['check', job]);
    expect(again.code).toBe(0);
    sqlite(db, "delete from readings where zone = 'West';");
    expect(readFileSync(db).length).toBe(before.length);
    expect(statSync(db).mtimeMs).toBeGreaterThanOrEqual(mtime);
  });

  it('refuses a query that writes: the file is opened read-only', () => {
    const job = writeJob(dir, `file: measures.sqlite\nquery: delete from readings\ndate: month\nvalue: amount`);
    expectBadInput(job, /job\.yaml:\d+:\d+: measures\.sqlite: the query returns no rows: it is not a SELECT/);
    expect(sqlite(db, 'select count(*) from readings;').trim()).toBe(String(MONTHS.length * 2));
  });

  it('bad input: one located line, exit 2, nothing written', () => {
    const cases: [string, RegExp][] = [
      // SQL syntax error: SQLite's message, at the query's line in the job (line 11: the query key).
      [
        `file: measures.sqlite\nquery: selec month, amount from readings\ndate: month\nvalue: amount`,
        /^.*job\.yaml:11:\d+: measures\.sqlite: SQLite: near "selec": syntax error — correct the query in the job$/,
      ],
      [
        `file: measures.sqlite\nquery: select month, amount from readingz\ndate: month\nvalue: amount`,
        /job\.yaml:11:\d+: measures\.sqlite: SQLite: no such table: readingz/,
      ],
      // A missing column lists the columns found.
      [
        `file: measures.sqlite\nquery: select month, amount from readings\ndate: month\nvalue: amt`,
        /measures\.sqlite: column "amt": there is no value column "amt"; columns found: "month", "amount" — name one of the columns found/,
      ],
      [
        `file: measures.sqlite\nquery: select month, amount from readings where zone = 'East'\ndate: month\nvalue: amount`,
        /measures\.sqlite: the query returned no rows — /,
      ],
      // Text where numbers are expected: the result row named.
      [
        `file: measures.sqlite\nquery: select month, zone from readings where zone = 'North'\ndate: month\nvalue: zone`,
        /measures\.sqlite: row 1, column "zone": "North" is not a number/,
      ],
      [
        `file: measures.sqlite\nquery: select month, amount from readings where month <= ?\nparameters: [period_end]\ndate: month\nvalue: amount`,
        /measures\.sqlite: the query's parameters \(period_end\) come from the reporting period, and none is set/,
      ],
    ];
    for (const [data, line] of cases) expectBadInput(writeJob(dir, data), line);
  });

  it('a file that is not a database', () => {
    const job = writeJob(dir, `file: not-a-db.sqlite\nformat: sqlite\nquery: select 1\ndate: month\nvalue: amount`);
    cpSync(GOOD_CSV, join(dir, 'not-a-db.sqlite'));
    expectBadInput(job, /not-a-db\.sqlite: the file is not a SQLite database/);
  });
});
