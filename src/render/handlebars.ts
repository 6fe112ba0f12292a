/**
 * A handlebars instance of our own for each renderer, without handlebars' `log` helper: `{{log …}}` in a
 * template override would write to the process's stdout, which carries the results of a command (and a
 * template's author has no business there). Without it, `{{log}}` is an ordinary, empty value, and
 * `{{log x}}` is an unknown helper, refused before rendering (templates.ts).
 */
import Handlebars from 'handlebars';

export function isolatedHandlebars(): typeof Handlebars {
  const hb = Handlebars.create();
  hb.unregisterHelper('log');
  limitPartialDepth(hb);
  return hb;
}

/** Real templates nest partials a few levels; this many means a partial includes itself without end. */
export const MAX_PARTIAL_DEPTH = 32;

/** Thrown past MAX_PARTIAL_DEPTH; html.ts turns it into a located error. `chain`: the partials, outermost first. */
export class PartialTooDeep extends Error {
  readonly chain: string[];
  constructor(chain: string[]) {
    super(`partials nested more than ${MAX_PARTIAL_DEPTH} levels deep`);
    this.chain = chain;
  }
}

type InvokePartial = (this: unknown, partial: unknown, context: unknown, options: { name?: string }) => string;

/**
 * Every partial, registered or inline, is invoked through the instance's VM.invokePartial (handlebars'
 * runtime calls env.VM.invokePartial): this instance gets its own copy of the VM with a counting one, so a
 * partial that includes itself stops at MAX_PARTIAL_DEPTH instead of running the process out of memory.
 */
function limitPartialDepth(hb: typeof Handlebars): void {
  const env = hb as unknown as { VM: Record<string, unknown> & { invokePartial: InvokePartial } };
  const invoke = env.VM.invokePartial;
  const chain: string[] = [];
  env.VM = {
    ...env.VM,
    invokePartial(this: unknown, partial, context, options) {
      chain.push(String(options?.name ?? '?'));
      try {
        if (chain.length > MAX_PARTIAL_DEPTH) throw new PartialTooDeep([...chain]);
        return invoke.call(this, partial, context, options);
      } finally {
        chain.pop();
      }
    },
  };
}
