/**
 * `trendbrief history`: what the record holds. `verify` walks the hash chain and names the first entry
 * that breaks it; `list` prints the history; `export` writes it as CSV or JSON; `index` builds one run's
 * index of briefs (an HTML page and a CSV) from the record, for a run spread over many machines.
 */
import { mkdirSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { BriefError } from '../errors.js';
import { loadJob } from '../job/load.js';
import { verifyChain } from '../record/chain.js';
import { historyCsv, historyJson, historyRow, runIndex, runIndexCsv, runIndexHtml } from '../record/export.js';
import { briefName } from '../record/publication.js';
import { type EntryFilter, openRecord, placeOf, type RecordPlace } from '../record/store.js';
import { writeFiles } from '../render/write.js';
import { parseCommand, usage } from './args.js';
import type { Console } from './output.js';
import { toolVersion } from './version.js';

export const help = `trendbrief history — what the record of published briefs holds

Usage: trendbrief history verify [JOB | --file FILE | --connection-env VAR]
       trendbrief history list   [JOB | --file FILE | --connection-env VAR] [--brief NAME] [--run NAME]
       trendbrief history export [JOB | --file FILE | --connection-env VAR] --as csv|json [--values] [--out FILE]
       trendbrief history index  [JOB | --file FILE | --connection-env VAR] --run NAME --out DIR

  verify             check that no entry was changed, removed or reordered (exit 2 names the first that was)
  list               one line per entry: number, time, brief, series, period, issue, trend change, reason
  export             every entry as CSV or JSON (--values adds the data values each brief used)
  index              one run's briefs, headlines and files as DIR/index.html and DIR/index.csv
  JOB                read the record the job file names (its record: settings)
  --file FILE        an SQLite record
  --connection-env VAR   the environment variable holding a PostgreSQL record's connection string
  --brief NAME       only this brief (with a JOB: that job's brief)
  --run NAME         only this run

Examples:
  trendbrief history verify examples/water-deliveries/job.yaml
  trendbrief history export --file trendbrief-record.sqlite --as csv --out history.csv
  trendbrief history index --connection-env TRENDBRIEF_RECORD_URL --run slurm-81234 --out out/index`;

export async function run(args: string[], con: Console): Promise<number> {
  const { values: o, positionals } = parseCommand('history', args, {
    file: { type: 'string' },
    'connection-env': { type: 'string' },
    brief: { type: 'string' },
    run: { type: 'string' },
    as: { type: 'string' },
    values: { type: 'boolean' },
    out: { type: 'string' },
  });
  const [action, jobFile, ...extra] = positionals;
  if (!['verify', 'list', 'export', 'index'].includes(action ?? ''))
    throw usage('history', `name what to do: verify, list, export or index${action ? `, not "${action}"` : ''}`);
  if (extra.length > 0) throw usage('history', `one job file at most, got ${[jobFile, ...extra].join(', ')}`);
  const { place, brief } = where(jobFile, o);
  const store = await openRecord(place, { toolVersion: await toolVersion(), write: false });
  try {
    const filter: EntryFilter = {};
    if (typeof o.brief === 'string') filter.brief = o.brief;
    else if (brief !== null && action !== 'verify' && action !== 'index') filter.brief = brief;
    if (typeof o.run === 'string') filter.run = o.run;
    if (action === 'verify') {
      const check = verifyChain(await store.entries());
      if (check.broken) {
        throw new BriefError(
          'record-broken',
          `${store.where}: entry ${check.broken.seq} breaks the chain: ${check.broken.why}`,
          `the record was altered at or after entry ${check.broken.seq}; keep a copy of it for the audit`,
          {},
        );
      }
      con.out(`${store.where}: ${check.count} entr${check.count === 1 ? 'y' : 'ies'}, the chain holds`);
      return 0;
    }
    if (action === 'index') {
      if (typeof o.run !== 'string') throw usage('history', 'index needs --run NAME', 'e.g. --run slurm-81234');
      if (typeof o.out !== 'string') throw usage('history', 'index needs --out DIR', 'e.g. --out out/index');
      const rows = runIndex(await store.entries({ ...filter, kind: 'publication' }));
      if (rows.length === 0)
        throw usage(
          'history',
          `the record holds no brief of run "${o.run}"`,
          'run "trendbrief history list" to see the runs',
        );
      const dir = resolve(o.out);
      mkdirSync(dir, { recursive: true });
      const link = (path: string) => relative(dir, path).split('\\').join('/');
      await writeFiles([
        { path: join(dir, 'index.html'), bytes: runIndexHtml(o.run, rows, link) },
        { path: join(dir, 'index.csv'), bytes: runIndexCsv(rows) },
      ]);
      con.info(`wrote ${join(dir, 'index.html')}`);
      con.info(`wrote ${join(dir, 'index.csv')}`);
      return 0;
    }
    const entries = await store.entries(filter);
    if (action === 'list') {
      for (const e of entries) {
        const r = historyRow(e);
        const what =
          e.kind === 'publication'
            ? `${e.series} ${e.period} issue ${e.issue}${r.trend_yoy_percent ? ` trend ${Number(r.trend_yoy_percent).toFixed(1)}%` : ''}`
            : `email to ${e.recipient} ${e.status}`;
        const group = e.group ? ` — ${e.group}` : '';
        con.out(`${e.seq}\t${e.recordedAt}\t${e.brief}${group}\t${what}${e.reason ? `\t(${e.reason})` : ''}\t${e.run}`);
      }
      return 0;
    }
    const as = o.as ?? 'csv';
    if (as !== 'csv' && as !== 'json') throw usage('history', `--as must be csv or json, got "${String(as)}"`);
    const text = as === 'csv' ? historyCsv(entries) : historyJson(entries, o.values === true);
    if (typeof o.out === 'string') {
      const path = resolve(o.out);
      mkdirSync(dirname(path), { recursive: true });
      await writeFiles([{ path, bytes: text }]);
      con.info(`wrote ${path}`);
    } else process.stdout.write(text);
    return 0;
  } finally {
    await store.close();
  }
}

/** The record a JOB names, or --file, or --connection-env; and the job's brief name, when a job is given. */
function where(
  jobFile: string | undefined,
  o: Record<string, string | boolean | undefined>,
): { place: RecordPlace; brief: string | null } {
  const given = [jobFile !== undefined, typeof o.file === 'string', typeof o['connection-env'] === 'string'];
  if (given.filter(Boolean).length !== 1)
    throw usage('history', 'name the record once: a job file, --file FILE or --connection-env VAR');
  if (typeof o.file === 'string') return { place: { store: 'sqlite', file: resolve(o.file) }, brief: null };
  if (typeof o['connection-env'] === 'string')
    return { place: { store: 'postgres', env: o['connection-env'] }, brief: null };
  const job = loadJob(jobFile as string);
  const place = placeOf(job.record);
  if (!place)
    throw usage(
      'history',
      `${jobFile} records nothing (record.store: none)`,
      'name the record with --file or --connection-env',
    );
  return { place, brief: briefName(job) };
}
