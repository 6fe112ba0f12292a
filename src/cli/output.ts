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

/** Writes a large string to stdout and resolves once it has been handed to the OS. */
export function writeStdout(text: string): Promise<void> {
  return new Promise((resolve, reject) => {
    process.stdout.write(text, (err) => (err ? reject(err) : resolve()));
  });
}
