/** Argument parsing on node:util parseArgs, with usage mistakes turned into one-line BriefErrors. */
import { type ParseArgsConfig, parseArgs } from 'node:util';
import { BriefError } from '../errors.js';

type Options = NonNullable<ParseArgsConfig['options']>;

export interface Parsed {
  values: Record<string, string | boolean | undefined>;
  positionals: string[];
}

export function parseCommand(command: string, args: string[], options: Options): Parsed {
  try {
    const r = parseArgs({ args, options, allowPositionals: true, strict: true });
    return { values: r.values as Parsed['values'], positionals: r.positionals };
  } catch (e) {
    const message = e instanceof Error ? e.message.split('\n')[0] : String(e);
    throw new BriefError(
      'usage',
      message.replace(/^TypeError \[[A-Z_]+\]: /, ''),
      `run "trendbrief ${command} --help" for the options`,
    );
  }
}

export function usage(command: string, message: string, hint?: string): BriefError {
  return new BriefError('usage', message, hint ?? `run "trendbrief ${command} --help" for the options`);
}

/** A whole number option, or a usage error naming it. */
export function intOption(command: string, name: string, text: string | undefined): number | null {
  if (text === undefined) return null;
  const v = Number(text);
  if (!Number.isInteger(v)) throw usage(command, `--${name} must be a whole number, got "${text}"`);
  return v;
}
