#!/usr/bin/env node
/**
 * The water example with a history: renders its brief for each month from February to September 2026, in
 * order, into one record, as a team would over eight months — so the September brief says what the August
 * brief said and what the same figure is now, and its firmness section compares seven published first
 * estimates with today's. Before the last month, one earlier value is corrected in the data, as a supplier
 * might, so the September brief also lists that source revision.
 *
 *   node examples/history.mjs [OUT]      (after npm ci; default OUT: out/water-history)
 *
 * OUT gets a copy of the job and data (the example itself is left as it is), the record
 * (OUT/trendbrief-record.sqlite) and one folder of briefs per month. The data are invented.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const out = resolve(process.argv[2] ?? join(root, 'out', 'water-history'));
const months = ['2026-02', '2026-03', '2026-04', '2026-05', '2026-06', '2026-07', '2026-08', '2026-09'];
/** The correction made before the last month: July 2026 in the North zone, as re-sent by the supplier. */
const CORRECTED = { month: '2026-07', zone: 'North', value: '7240.0' };

rmSync(out, { recursive: true, force: true });
// Not the record README's render command leaves beside the example's job: this history starts afresh.
cpSync(join(root, 'examples', 'water-deliveries'), out, {
  recursive: true,
  filter: (path) => !basename(path).startsWith('trendbrief-record.sqlite'),
});
const data = join(out, 'data', 'deliveries.csv');

for (const [i, month] of months.entries()) {
  if (i === months.length - 1) {
    const text = readFileSync(data, 'utf8');
    const row = new RegExp(`^${CORRECTED.month},${CORRECTED.zone},[^\\n]*$`, 'm');
    writeFileSync(data, text.replace(row, `${CORRECTED.month},${CORRECTED.zone},${CORRECTED.value}`));
  }
  // Each month's brief dated the first day of the month after (a fixed time keeps reruns byte-identical).
  const [y, m] = month.split('-').map(Number);
  const epoch = String(Date.UTC(m === 12 ? y + 1 : y, m % 12, 1, 9) / 1000);
  const r = spawnSync(
    process.execPath,
    [
      join(root, 'bin', 'trendbrief.js'),
      'render',
      join(out, 'job.yaml'),
      '--period',
      month,
      '--out',
      join(out, month),
      '--format',
      'html,json',
      '--record',
      'always',
      '--run',
      `monthly-${month}`,
      '--quiet',
    ],
    { stdio: 'inherit', env: { ...process.env, SOURCE_DATE_EPOCH: epoch } },
  );
  if (r.status !== 0) process.exit(r.status ?? 1);
}

const last = JSON.parse(readFileSync(join(out, months.at(-1), 'water-delivered-north-zone.json'), 'utf8'));
for (const s of last.series[0].statements) {
  if (s.kind === 'history' || s.id === 'firmness-published') console.log(`${s.text}\n`);
}
console.log(`Briefs in ${out}/<month>/; the record is ${join(out, 'trendbrief-record.sqlite')}.`);
