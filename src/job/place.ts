/**
 * Where a setting is written in its job file, for messages about problems found only once the data are
 * known (a period outside the data, too few values for a period). The job reader (load.ts) leaves each job's
 * parsed document here; a job that crossed to a worker thread is a copy, whose file is parsed again on
 * demand. The YAML parser is loaded only then, so a worker building series does not load it.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Document, LineCounter, Node, Scalar } from 'yaml';
import { BriefError, type Place } from '../errors.js';
import type { Job } from '../vocabulary/settings.js';

/** The parsed document of each loaded job, so later stages can point at the line of a setting. */
const written = new WeakMap<Job, { doc: Document; lines: LineCounter }>();

/** Keeps the parsed document of a job just read. */
export function rememberSource(job: Job, doc: Document, lines: LineCounter): void {
  written.set(job, { doc, lines });
}

/**
 * Where the first of `paths` that the job file sets is written ("brief.period", "series.0.decomposition.model"),
 * as the job file and its line and column; the job file alone when none is set.
 */
export function placeInJob(job: Job, ...paths: string[]): Place {
  const source = written.get(job) ?? parsedAgain(job);
  for (const path of source ? paths : []) {
    const parts = path.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p));
    const node = source?.doc.getIn(parts, true) as Node | undefined;
    if (source && node?.range) {
      const { line, col } = source.lines.linePos(node.range[0]);
      return { file: job.file, line, column: col };
    }
  }
  return { file: job.file };
}

/**
 * A job that crossed to a worker thread is a copy the map does not know: parse its file again, if it still
 * holds the same bytes (positions in a changed file would point at the wrong line).
 */
function parsedAgain(job: Job): { doc: Document; lines: LineCounter } | undefined {
  try {
    const bytes = readFileSync(job.file);
    if (createHash('sha256').update(bytes).digest('hex') !== job.sha256) return undefined;
    const yaml = createRequire(import.meta.url)('yaml') as typeof import('yaml');
    const lines = new yaml.LineCounter();
    const doc = yaml.parseDocument(bytes.toString('utf8'), { lineCounter: lines, schema: 'core', logLevel: 'error' });
    written.set(job, { doc, lines });
    return { doc, lines };
  } catch {
    return undefined;
  }
}

/**
 * A database's error about the query of series i, moved to where the job writes that query: the line of
 * the character the database points at (its 1-based `offset` in the query), or the query's first line.
 * The message keeps the source's name (the SQLite file or PostgreSQL's variable) in front.
 */
export function queryErrorInJob(e: BriefError & { offset: number | null }, job: Job, i: number): BriefError {
  const source = written.get(job) ?? parsedAgain(job);
  const node = source?.doc.getIn(['series', i, 'data', 'query'], true) as Scalar | undefined;
  if (!source || !node?.range) return e;
  let { line, col } = source.lines.linePos(node.range[0]);
  const block = node.type === 'BLOCK_LITERAL' || node.type === 'BLOCK_FOLDED';
  if (block) {
    // The text starts on the line after the | or >; its lines follow one to a line (literal style).
    line += 1;
    col = 1;
  }
  // Only a literal block keeps the query's line breaks as the file's; other styles fold them.
  if (e.offset !== null && node.type === 'BLOCK_LITERAL' && typeof node.value === 'string') {
    line += node.value.slice(0, Math.max(0, e.offset - 1)).split('\n').length - 1;
  }
  const from = e.place.file ? `${e.place.file}: ` : '';
  return new BriefError(e.code, `${from}${e.message}`, e.hint, { file: job.file, line, column: col }, e.exitCode);
}
