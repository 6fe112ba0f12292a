/**
 * How the HTML brief's templates are compiled, in one place for the two that compile them: the renderer at
 * run time (html.ts, for a job's own templates) and scripts/precompile-templates.mjs at build time (for the
 * built-in ones, so a fresh process does not parse and generate code for them again).
 */

/** The helpers a template may call (html.ts registers them; the compiler is told no others exist). */
export const TEMPLATE_HELPERS = ['cssColour', 'cssPageSize', 'ofKind'] as const;

export const COMPILE_OPTIONS = {
  strict: false,
  knownHelpersOnly: true,
  // `log` is taken off the instance (handlebars.ts), so the compiler must not call it as a known helper.
  knownHelpers: { ...Object.fromEntries(TEMPLATE_HELPERS.map((n) => [n, true])), log: false },
  preventIndent: true,
} as const;
