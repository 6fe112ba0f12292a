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
    const r = parseArgs({ args: negativeValues(args, options), options, allowPositionals: true, strict: true });
    return { values: r.values as Parsed['values'], positionals: r.positionals };
  } catch (e) {
    const first = e instanceof Error ? e.message.split('\n')[0] : String(e);
    // node's text for an unknown option runs on into advice about positionals that reads as garbage here.
    const unknown = /^Unknown option '([^']*)'/.exec(first);
    const message = unknown ? `unknown option "${unknown[1]}"` : first;
    throw new BriefError(
      'usage',
      message.replace(/^TypeError \[[A-Z_]+\]: /, ''),
      `run "trendbrief ${command} --help" for the options`,
    );
  }
}

/**
 * `--shard -1/3` or `--period -5`: parseArgs will not take a value that starts with a dash after a space (it
 * might be an option forgotten its value), and says only that the argument "is ambiguous". A dash followed
 * by a digit is never one of our options, so it is handed over as `--shard=-1/3`, and the option's own check
 * says what is wrong with it.
 */
function negativeValues(args: string[], options: Options): string[] {
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    if (args[i] === '--') {
      out.push(...args.slice(i));
      break;
    }
    const name = args[i].startsWith('--') ? args[i].slice(2) : null;
    const next = args[i + 1];
    if (name !== null && options[name]?.type === 'string' && next !== undefined && /^-\d/.test(next)) {
      out.push(`${args[i]}=${next}`);
      i++;
    } else out.push(args[i]);
  }
  return out;
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
