/**
 * `trendbrief check JOB`: validate the job and its data, run the analysis, and print the diagnostics and
 * the files a render would write. Writes nothing.
 */
import { resolve } from 'node:path';
import { buildBriefs } from '../brief/build.js';
import { loadJob } from '../job/load.js';
import { formatNumber, formatPercent } from '../narrate/format.js';
import { fileStem } from '../render/names.js';
import type { SeriesBrief } from '../vocabulary/brief.js';
import { parseCommand, usage } from './args.js';
import type { Console } from './output.js';
import { periodOption } from './period-option.js';
import { toolVersion } from './version.js';

export const help = `trendbrief check — validate a job and its data without writing anything

Usage: trendbrief check JOB.yaml [--period YYYY-MM] [--out DIR]

Prints each series' settings, the automatic model choice and its reason, the diagnostics (strength of
trend and seasonality, unusual periods, residual seasonality) and the files that render would write.

Example:
  trendbrief check examples/water-deliveries/job.yaml`;

export async function run(args: string[], con: Console): Promise<number> {
  const { values: o, positionals } = parseCommand('check', args, {
    period: { type: 'string' },
    out: { type: 'string' },
  });
  if (positionals.length !== 1) throw usage('check', 'name one job file', 'e.g. trendbrief check job.yaml');
  const job = loadJob(positionals[0]);
  const units = await buildBriefs(job, {
    period: typeof o.period === 'string' ? periodOption('check', o.period) : null,
    toolVersion: await toolVersion(),
    charts: false,
  });
  const outDir = resolve(typeof o.out === 'string' ? o.out : resolve(job.dir, 'out'));
  let failed = 0;
  // Bad input is one clear line per brief that cannot be made, and nothing else: no "valid job" before it.
  const bad = units.filter((u) => u.error?.exitCode === 2);
  if (bad.length > 0) {
    for (const u of bad) con.error(u.error?.oneLine() ?? '');
    return 2;
  }
  con.out(
    `${positionals[0]}: valid job, ${job.series.length} series, ${units.length} brief${units.length === 1 ? '' : 's'}`,
  );
  for (const u of units) {
    const name = u.group === null ? 'brief' : `brief for ${u.group}`;
    if (u.error || !u.brief) {
      failed++;
      con.error(`${name}: ${u.error?.oneLine()}`);
      continue;
    }
    const locale = u.brief.meta.locale;
    con.out(`\n${name}: ${u.brief.meta.title}`);
    for (const s of u.brief.series) con.out(describe(s, locale));
    const stem = resolve(outDir, fileStem(u.brief.meta.title));
    con.out(`  would write: ${job.brief.outputs.map((f) => `${stem}.${f}`).join(', ')}`);
  }
  return failed > 0 ? (units.every((u) => u.error?.exitCode === 2) ? 2 : 1) : 0;
}

function describe(s: SeriesBrief, locale: string): string {
  const d = s.diagnostics;
  const st = s.settings;
  const f = (v: number) => formatNumber(v, locale, 2);
  const lines = [
    `  series ${s.id} (${s.label}): ${s.frequency}, ${s.components.dates.length} periods ${s.components.dates[0]} to ${s.reportingDate}`,
    `    method ${st.method}, period${st.periods.length > 1 ? 's' : ''} ${st.periods.join(', ')}, model ${st.modelReason}`,
    `    strength of trend ${f(d.trendStrength)}, of seasonality ${f(d.seasonalStrength)}`,
    `    unusual periods: ${d.outliers.length === 0 ? 'none' : d.outliers.map((o) => o.date).join(', ')}`,
    ...(d.identifiableSeasonality ?? []).map(
      (t) =>
        `    identifiable seasonality, period ${t.period}: ${t.verdict === 'present' ? 'present' : t.verdict === 'none' ? 'none' : 'probably none'} (combined test; stable-seasonality F = ${f(t.stable.statistic)}, p = ${formatNumber(t.stable.pValue, locale, 3)}, at the ${formatNumber(100 * t.levels.stable, locale)}% level)`,
    ),
    st.seasonalAdjustment.applied
      ? `    residual seasonality: ${d.residualSeasonality.present ? 'some seasonality is left in the adjusted series' : 'none found'} at the ${formatNumber(100 * d.residualSeasonality.level, locale)}% level (F = ${f(d.residualSeasonality.statistic)}, p = ${formatNumber(d.residualSeasonality.pValue, locale, 3)})`
      : '    not seasonally adjusted: no period has identifiable seasonality',
    `    trend year on year: ${formatPercent(s.analysis.trendYoY.percent, locale, true)}`,
  ];
  const sheet = s.data.source?.startsWith('sheet ') ? `, sheet "${s.data.source.slice(6)}"` : '';
  lines.splice(
    1,
    0,
    `    read ${s.data.file}${sheet}${s.data.query ? ' (query)' : ''}: ${s.data.rows} rows, first period ${s.components.dates[0]}, last ${s.reportingDate}`,
  );
  if (s.data.gaps.length > 0) lines.push(`    missing periods: ${s.data.gaps.join(', ')}`);
  for (const n of s.data.notes) lines.push(`    note: ${n}`);
  return lines.join('\n');
}
