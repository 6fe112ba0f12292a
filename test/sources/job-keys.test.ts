/**
 * The job checks of the source keys: each source takes only its own keys, a database needs a query, and a
 * data block names a file or a connection variable; each mistake is one line at its place in the job.
 */
import { rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import { tempDir, writeJob } from './common.js';

function problem(job: string): string {
  try {
    loadJob(job);
  } catch (e) {
    if (e instanceof BriefError) return e.oneLine();
    throw e;
  }
  return 'no problem';
}

describe('source keys in the job', () => {
  let dir: string;
  beforeAll(() => {
    dir = tempDir('keys');
    writeFileSync(join(dir, 'a.csv'), 'month,value\n2024-01,1\n');
    writeFileSync(join(dir, 'a.sqlite'), '');
    writeFileSync(join(dir, 'a.xlsx'), '');
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('resolves each kind of source', () => {
    const pg = loadJob(writeJob(dir, 'connection_env: SALES_DB\nquery: select 1\ndate: d\nvalue: v'));
    expect(pg.series[0].data).toMatchObject({
      format: 'postgres',
      file: '',
      fileAsWritten: 'PostgreSQL ($SALES_DB)',
      connectionEnv: 'SALES_DB',
      timeoutSeconds: 60,
    });
    const book = loadJob(writeJob(dir, 'file: a.xlsx\nsheet: 2\nheader_row: 4\ndate: d\nvalue: v'));
    expect(book.series[0].data).toMatchObject({ format: 'xlsx', sheet: 2, headerRow: 4, range: null });
    const db = loadJob(
      writeJob(dir, 'file: a.sqlite\nquery: select 1\nparameters: [period_end]\ntimeout: 5\ndate: d\nvalue: v'),
    );
    expect(db.series[0].data).toMatchObject({ format: 'sqlite', parameters: ['period_end'], timeoutSeconds: 5 });
  });

  it('refuses keys of another kind of source, a database without a query, and no source at all', () => {
    // Line 10 is the first line of the data block (writeJob puts it there).
    expect(problem(writeJob(dir, 'file: a.csv\nsheet: Data\ndate: d\nvalue: v'))).toMatch(
      /job\.yaml:11:7: sheet is for Excel workbooks, and this source is a csv file — remove it/,
    );
    expect(problem(writeJob(dir, 'file: a.csv\nquery: select 1\ndate: d\nvalue: v'))).toMatch(
      /job\.yaml:11:7: query is for databases, and this source is a csv file/,
    );
    expect(problem(writeJob(dir, 'file: a.sqlite\ndate: d\nvalue: v'))).toMatch(
      /job\.yaml:10:13: a SQLite source needs a query/,
    );
    expect(problem(writeJob(dir, 'connection_env: X\nfile: a.csv\nquery: select 1\ndate: d\nvalue: v'))).toMatch(
      /job\.yaml:11:7: file does not go with connection_env/,
    );
    expect(problem(writeJob(dir, 'connection_env: X\ndate: d\nvalue: v'))).toMatch(/a PostgreSQL source needs a query/);
    expect(problem(writeJob(dir, 'date: d\nvalue: v'))).toMatch(
      /data names no source: neither file nor connection_env/,
    );
    expect(problem(writeJob(dir, 'connection_env: "not a name"\nquery: select 1\ndate: d\nvalue: v'))).toMatch(
      /connection_env must be the name of an environment variable/,
    );
    expect(problem(writeJob(dir, 'file: a.xlsx\nrange: A1-B5\ndate: d\nvalue: v'))).toMatch(
      /range must be a cell range such as B3:E200/,
    );
  });
});
