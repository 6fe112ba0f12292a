/**
 * The HTML brief: the brief's document (src/document/) walked by the handlebars templates — brief.hbs
 * walks the sections, and each block is drawn by the partial named after its kind — as one self-contained
 * file: stylesheet inlined, charts inline as SVG, no script and nothing fetched. All text from the job goes
 * through handlebars' escaping; only our own chart SVG and the stylesheet are inserted raw. Layout lives in
 * templates/, what the brief says in the document: nothing is chosen or computed here.
 */

import type { BriefDocument } from '../document/blocks.js';
import { buildDocument } from '../document/build.js';
import { briefView } from '../document/view.js';
import { FALLBACK_ACCENT } from '../document/words.js';
import { BriefError, withCause } from '../errors.js';
import type { Brief, Statement } from '../vocabulary/brief.js';
import { COMPILE_OPTIONS, TEMPLATE_HELPERS } from './compile-options.js';
import { isolatedHandlebars, MAX_PARTIAL_DEPTH, PartialTooDeep } from './handlebars.js';
import { precompiledFor } from './precompiled.js';
import type { TemplateSource } from './template-source.js';
import { checkTemplates, loadTemplates, partialCall, type TemplateSet } from './templates.js';
import { withFonts, withFontsPieces } from './web-fonts.js';

export interface HtmlOptions {
  /** A folder whose brief.hbs, brief.css and partials/<name>.hbs replace the built-in files of the same name. */
  templatesDir?: string | null;
  /** The document, when the caller has it already (the PDF and email are drawn from the same one). */
  document?: BriefDocument;
}

/**
 * The only helpers a template may call, registered on an isolated handlebars instance. Each takes the
 * handlebars options object last, which is why the rest arguments are filtered.
 */
const HELPERS: Record<(typeof TEMPLATE_HELPERS)[number], (...args: unknown[]) => unknown> = {
  /** A colour safe inside CSS: exactly #rgb or #rrggbb, else the fallback accent. */
  cssColour: (value: unknown) =>
    typeof value === 'string' && /^#(?:[0-9a-fA-F]{3}){1,2}$/.test(value) ? value : FALLBACK_ACCENT,
  /** The CSS @page size keyword for the view's page size. */
  cssPageSize: (value: unknown) => (value === 'Letter' ? 'letter' : 'A4'),
  /** The statements of the given kinds, in their order: {{#each (ofKind statements "context" "seasonal")}}. */
  ofKind: (list: unknown, ...rest: unknown[]) => {
    const kinds = rest.slice(0, -1);
    return Array.isArray(list) ? (list as Statement[]).filter((s) => kinds.includes(s.kind)) : [];
  },
};

export function renderHtml(brief: Brief, options: HtmlOptions = {}): string {
  return withFonts(page(brief, options));
}

/** The same HTML brief as UTF-8 pieces for a file (its fonts' bytes shared by the briefs of a batch). */
export function renderHtmlPieces(brief: Brief, options: HtmlOptions = {}): Buffer[] {
  return withFontsPieces(page(brief, options));
}

/** The page before its fonts. */
function page(brief: Brief, options: HtmlOptions): string {
  return compiledBrief(loadTemplates(options.templatesDir ?? null))(
    options.document ?? buildDocument(brief, briefView(brief)),
  );
}

/** Compiled sets by their files and texts: a batch of briefs compiles its templates once, not per brief. */
const compiledSets = new Map<string, (document: BriefDocument) => string>();

function compiledBrief(set: TemplateSet): (document: BriefDocument) => string {
  const key = JSON.stringify([set.main, set.css, [...set.partials.values()]]);
  let render = compiledSets.get(key);
  if (render === undefined) {
    render = compileBrief(set);
    if (compiledSets.size >= 16) compiledSets.clear();
    compiledSets.set(key, render);
  }
  return render;
}

/** Checks and compiles a template set once; the returned function renders any view with it. */
export function compileBrief(set: TemplateSet): (document: BriefDocument) => string {
  checkTemplates(set, TEMPLATE_HELPERS);
  const hb = isolatedHandlebars();
  for (const [name, fn] of Object.entries(HELPERS)) hb.registerHelper(name, fn);
  const compile = (src: TemplateSource): HandlebarsTemplateDelegate => {
    const done = precompiledFor(src);
    return located(done ? hb.template(done.spec) : hb.compile(src.text, COMPILE_OPTIONS as CompileOptions), src);
  };
  for (const p of set.partials.values()) hb.registerPartial(p.name, compile(p));
  const main = compile(set.main);
  return (document) =>
    main(document, {
      data: { css: set.css.text },
      allowProtoPropertiesByDefault: false,
      allowProtoMethodsByDefault: false,
      allowCallsToHelperMissing: false,
    });
}

/**
 * Handlebars compiles lazily and throws plain errors while rendering; this pins any such error to the
 * template it came from (the innermost partial wins, since its wrapper sees the error first).
 */
function located(fn: HandlebarsTemplateDelegate, src: TemplateSource): HandlebarsTemplateDelegate {
  return (context, options) => {
    try {
      return fn(context, options);
    } catch (e) {
      if (e instanceof BriefError) throw e;
      if (e instanceof PartialTooDeep) throw tooDeep(e, src);
      const err = e as Error & { lineNumber?: number; column?: number };
      const message = String(err.message)
        .split('\n')[0]
        .replace(/ - \d+:\d+$/, '');
      const place =
        err.lineNumber === undefined
          ? { file: src.file }
          : { file: src.file, line: err.lineNumber, column: (err.column ?? 0) + 1 };
      throw withCause(
        new BriefError(
          'template-render',
          `the template cannot be rendered: ${message}`,
          'compare it with the built-in template of the same name',
          place,
        ),
        e,
      );
    }
  };
}

/**
 * A partial included more than MAX_PARTIAL_DEPTH levels deep, reported at the {{> …}} of the innermost
 * template that includes it (the caller whose wrapper sees the error first).
 */
function tooDeep(e: PartialTooDeep, src: TemplateSource): BriefError {
  const name = e.chain[e.chain.length - 1];
  const loop = e.chain.slice(e.chain.lastIndexOf(name, e.chain.length - 2));
  const through =
    loop.length > 2
      ? ` through ${loop
          .slice(1, -1)
          .map((n) => `"${n}"`)
          .join(', ')}`
      : '';
  const at = partialCall(src, name);
  return new BriefError(
    'template-partial-depth',
    `the partial "${name}" includes itself${through} without end (partials nested more than ${MAX_PARTIAL_DEPTH} levels deep)`,
    'end the loop: include the partial only inside an {{#if}} or {{#each}} that runs out, or not at all',
    at ? { file: src.file, ...at } : { file: src.file },
  );
}
