/**
 * Where the command line speaks: results on stdout, messages on stderr, colour only on a terminal and
 * never when NO_COLOR is set (no-color.org). Levels: quiet (errors only), normal, verbose.
 */
export type Verbosity = 'quiet' | 'normal' | 'verbose';

export interface Console {
  verbosity: Verbosity;
  debug: boolean;
  /** A result line (stdout). */
  out(text: string): void;
  /** A progress or information line (stderr), hidden with --quiet. */
  info(text: string): void;
  /** Only with --verbose. */
  detail(text: string): void;
  /** An error line (stderr), always shown. */
  error(text: string): void;
  colour: boolean;
}

export function makeConsole(verbosity: Verbosity, debug: boolean): Console {
  const colour = Boolean(process.stderr.isTTY) && !process.env.NO_COLOR && process.env.TERM !== 'dumb';
  const red = (s: string): string => (colour ? `\x1b[31m${s}\x1b[0m` : s);
  return {
    verbosity,
    debug,
    colour,
    out: (text) => process.stdout.write(`${text}\n`),
    info: (text) => {
      if (verbosity !== 'quiet') process.stderr.write(`${text}\n`);
    },
    detail: (text) => {
      if (verbosity === 'verbose') process.stderr.write(`${text}\n`);
    },
    error: (text) => process.stderr.write(`${red(text)}\n`),
  };
}

/**
 * Writes text to stdout piece by piece, waiting whenever the pipe is full, so a large result never sits in
 * memory twice. A reader that stops early (`| head`) ends the writing quietly instead of crashing.
 */
export async function writeStdout(pieces: string | Iterable<string>): Promise<void> {
  const out = process.stdout;
  let closed = false;
  const onError = (e: NodeJS.ErrnoException): void => {
    if (e.code === 'EPIPE') closed = true;
    else throw e;
  };
  out.on('error', onError);
  try {
    for (const piece of typeof pieces === 'string' ? [pieces] : pieces) {
      if (closed) return;
      if (!out.write(piece))
        await new Promise<void>((resolve) => {
          const done = (): void => {
            out.off('drain', done);
            out.off('close', done);
            out.off('error', done);
            resolve();
          };
          out.once('drain', done);
          out.once('close', done);
          out.once('error', done);
        });
    }
    if (closed) return;
    await new Promise<void>((resolve) => out.write('', () => resolve()));
  } finally {
    out.off('error', onError);
  }
}
