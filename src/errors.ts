/**
 * The one error type of trendbrief. Every failure a user can cause carries a code, the place it was found
 * (file, line and column, or row and column of a data file) and a hint saying how to fix it. The command
 * line prints it as a single line; only `--debug` shows a stack trace.
 */
export interface Place {
  file?: string;
  line?: number;
  column?: number;
  row?: number;
  field?: string;
}

/** Exit codes: 2 for input the user must change, 1 for a run that failed for another reason. */
export type ExitCode = 1 | 2;

export class BriefError extends Error {
  readonly code: string;
  readonly place: Place;
  readonly hint: string;
  readonly exitCode: ExitCode;

  constructor(code: string, message: string, hint: string, place: Place = {}, exitCode: ExitCode = 2) {
    super(message);
    this.name = 'BriefError';
    this.code = code;
    this.place = place;
    this.hint = hint;
    this.exitCode = exitCode;
  }

  /**
   * `file:line:col: message — hint`, or `file: row 12, column "value": message — hint`. A line break or other
   * control character quoted from the input (a cell holding a newline) is shown escaped, so it stays one line.
   */
  oneLine(): string {
    return `${placeText(this.place)}${this.message}${this.hint ? ` — ${this.hint}` : ''}`.replace(
      /[\p{Cc}\u2028\u2029]/gu,
      (c) => JSON.stringify(c).slice(1, -1),
    );
  }
}

export function placeText(place: Place): string {
  const parts: string[] = [];
  if (place.file) {
    let head = place.file;
    if (place.line !== undefined) {
      head += `:${place.line}`;
      if (place.column !== undefined) head += `:${place.column}`;
    }
    parts.push(head);
  }
  const where: string[] = [];
  if (place.row !== undefined) where.push(`row ${place.row}`);
  if (place.field !== undefined) where.push(`column "${place.field}"`);
  if (where.length > 0) parts.push(where.join(', '));
  return parts.length > 0 ? `${parts.join(': ')}: ` : '';
}

/** Several located errors found at once (a job file with three mistakes reports all three). */
export class BriefErrors extends BriefError {
  readonly errors: BriefError[];
  constructor(errors: BriefError[]) {
    const first = errors[0];
    super(first.code, first.message, first.hint, first.place, first.exitCode);
    this.errors = errors;
  }
  override oneLine(): string {
    return this.errors.map((e) => e.oneLine()).join('\n');
  }
}

/** Keeps the error a BriefError was made from, so --debug can show where it really happened. */
export function withCause<T extends Error>(error: T, cause: unknown): T {
  (error as Error & { cause?: unknown }).cause = cause;
  return error;
}

/** A located error as it crosses between threads (a BriefError itself does not survive the copy). */
export interface ThreadError {
  code: string;
  message: string;
  hint: string;
  place: Place;
  exitCode: ExitCode;
  /** Where it happened on the other thread, for --debug. */
  stack: string;
}

export function errorForThread(e: BriefError): ThreadError {
  const { code, message, hint, place, exitCode } = e;
  return { code, message, hint, place, exitCode, stack: debugStack(e) };
}

export function errorFromThread(t: ThreadError): BriefError {
  const error = new BriefError(t.code, t.message, t.hint, t.place, t.exitCode);
  error.stack = t.stack;
  return error;
}

/**
 * The stack trace --debug prints: the error's own and that of every error it was made from
 * ("caused by: …"), as text, so it can also cross from a worker thread.
 */
export function debugStack(e: unknown): string {
  const parts: string[] = [];
  const seen = new Set<unknown>();
  let cur: unknown = e;
  while (cur !== undefined && cur !== null && !seen.has(cur) && parts.length < 8) {
    seen.add(cur);
    const text = cur instanceof Error ? (cur.stack ?? `${cur.name}: ${cur.message}`) : String(cur);
    parts.push(parts.length === 0 ? text : `caused by: ${text}`);
    cur = cur instanceof Error ? (cur as Error & { cause?: unknown }).cause : undefined;
  }
  return parts.join('\n');
}
