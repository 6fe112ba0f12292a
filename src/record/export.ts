/**
 * The record's history as tables: CSV (RFC 4180: fields with a comma, quote or line break quoted, quotes
 * doubled) and JSON (each entry with its body parsed), and one run's index of briefs as CSV and HTML.
 */
import type { Entry, PublicationBody } from './types.js';

export const HISTORY_COLUMNS = [
  'seq',
  'kind',
  'recorded_at',
  'brief',
  'group',
  'series',
  'period',
  'issue',
  'reason',
  'run',
  'shard',
  'tool_version',
  'trend_yoy_percent',
  'headline',
  'recipient',
  'status',
  'files',
  'job_sha256',
  'data_sha256',
  'message',
  'prev_hash',
  'hash',
] as const;

function bodyOf(e: Entry): Partial<PublicationBody> {
  try {
    return JSON.parse(e.body) as Partial<PublicationBody>;
  } catch {
    return {};
  }
}

/** One row of the history: the entry's fields and, for a publication, its headline figure and files. */
export function historyRow(e: Entry): Record<(typeof HISTORY_COLUMNS)[number], string> {
  const b = e.kind === 'publication' ? bodyOf(e) : {};
  return {
    seq: String(e.seq),
    kind: e.kind,
    recorded_at: e.recordedAt,
    brief: e.brief,
    group: e.group,
    series: e.series,
    period: e.period,
    issue: e.kind === 'publication' ? String(e.issue) : '',
    reason: e.reason,
    run: e.run,
    shard: e.shard,
    tool_version: e.toolVersion,
    trend_yoy_percent: b.trendYoYPercent == null ? '' : String(b.trendYoYPercent),
    headline: b.statements?.find((s) => s.kind === 'headline')?.text ?? '',
    recipient: e.recipient,
    status: e.status,
    files: (b.files ?? []).map((f) => `${f.path} sha256:${f.sha256}`).join('; '),
    job_sha256: e.jobSha256,
    data_sha256: e.dataSha256,
    message: e.message,
    prev_hash: e.prevHash,
    hash: e.hash,
  };
}

export function csvField(v: string): string {
  return /[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

export function toCsv(header: readonly string[], rows: string[][]): string {
  return [header, ...rows].map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}

export function historyCsv(entries: Entry[]): string {
  return toCsv(
    HISTORY_COLUMNS,
    entries.map((e) => {
      const row = historyRow(e);
      return HISTORY_COLUMNS.map((c) => row[c]);
    }),
  );
}

/** Every field of every entry, the body as parsed JSON; `values` false leaves the data values out. */
export function historyJson(entries: Entry[], values: boolean): string {
  const out = entries.map((e) => {
    const body = bodyOf(e) as Record<string, unknown>;
    if (!values) {
      delete body.dates;
      delete body.values;
    }
    const { body: _text, ...fields } = e;
    return { ...fields, body };
  });
  return `${JSON.stringify(out, null, 2)}\n`;
}

export interface IndexRow {
  brief: string;
  group: string;
  title: string;
  series: string;
  label: string;
  period: string;
  issue: number;
  shard: string;
  headline: string;
  files: { path: string; sha256: string }[];
}

/** One run's briefs from its publication entries, in the order of brief, group and series. */
export function runIndex(entries: Entry[]): IndexRow[] {
  return entries
    .filter((e) => e.kind === 'publication')
    .map((e) => {
      const b = bodyOf(e);
      return {
        brief: e.brief,
        group: e.group,
        title: b.title ?? e.brief,
        series: e.series,
        label: b.label ?? e.series,
        period: e.period,
        issue: e.issue,
        shard: e.shard,
        headline: b.statements?.find((s) => s.kind === 'headline')?.text ?? '',
        files: (b.files ?? []).map((f) => ({ path: f.path, sha256: f.sha256 })),
      };
    })
    .sort(
      (a, b) => a.title.localeCompare(b.title) || a.group.localeCompare(b.group) || a.series.localeCompare(b.series),
    );
}

export function runIndexCsv(rows: IndexRow[]): string {
  return toCsv(
    ['title', 'brief', 'group', 'series', 'period', 'issue', 'shard', 'headline', 'files'],
    rows.map((r) => [
      r.title,
      r.brief,
      r.group,
      r.series,
      r.period,
      String(r.issue),
      r.shard,
      r.headline,
      r.files.map((f) => f.path).join('; '),
    ]),
  );
}

const htmlText = (s: string): string =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);

/** The run's index as one HTML page: every brief, its headline and links to its files (relative to `base`). */
export function runIndexHtml(run: string, rows: IndexRow[], link: (path: string) => string): string {
  const body = rows
    .map(
      (r) =>
        `<tr><td>${htmlText(r.title)}</td><td>${htmlText(r.label)}</td><td>${htmlText(r.period)}</td><td class="n">${r.issue}</td><td>${htmlText(r.headline)}</td><td>${r.files
          .map(
            (f) =>
              `<a href="${htmlText(link(f.path))}" title="sha256 ${f.sha256}">${htmlText(f.path.split(/[\\/]/).pop() ?? f.path)}</a>`,
          )
          .join('<br>')}</td></tr>`,
    )
    .join('\n');
  const briefs = new Set(rows.map((r) => `${r.brief}\u0000${r.group}`)).size;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>Briefs of run ${htmlText(run)}</title>
<style>
body { font-family: system-ui, sans-serif; margin: 2rem; color: #1a1a1a; }
table { border-collapse: collapse; width: 100%; }
th, td { text-align: left; vertical-align: top; padding: .35rem .6rem; border-bottom: 1px solid #ddd; }
th { background: #f2f4f7; }
td.n { text-align: right; }
</style>
</head>
<body>
<h1>Briefs of run ${htmlText(run)}</h1>
<p>${briefs} brief${briefs === 1 ? '' : 's'}, ${rows.length} series, from the record.</p>
<table>
<thead><tr><th>Brief</th><th>Series</th><th>Period</th><th>Issue</th><th>Headline</th><th>Files</th></tr></thead>
<tbody>
${body}
</tbody>
</table>
</body>
</html>
`;
}
