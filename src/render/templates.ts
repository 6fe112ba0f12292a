/**
 * The HTML brief's templates: the built-in set in templates/ (brief.hbs, partials/<name>.hbs, brief.css),
 * with any file of the same name in the job's templates folder taking its place. Every template is parsed
 * and checked here, before anything is rendered, so a broken override fails with one line naming the file,
 * the line and what is wrong rather than with a half-written page or a handlebars stack trace.
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Handlebars from 'handlebars';
import { BriefError } from '../errors.js';
import { NotRegularFile, readRegularFile } from '../read-file.js';
import { cssProblem } from './css-check.js';
import { cssCheckedAtBuild, precompiledFor } from './precompiled.js';
import type { TemplateSource } from './template-source.js';

export interface TemplateSet {
  main: TemplateSource;
  partials: Map<string, TemplateSource>;
  css: TemplateSource;
}

/** The built-in templates: templates/ at the package root (two levels above both src/render and dist/render). */
export const DEFAULT_TEMPLATES_DIR = fileURLToPath(new URL('../../templates/', import.meta.url));

/** Helpers handlebars itself provides on every instance and we keep (not `log`: see handlebars.ts). */
export const BUILTIN_HELPERS = ['if', 'unless', 'each', 'with', 'lookup'] as const;

/** Reads the built-in set and lays the overrides of `overridesDir` (if any) over it by file name. */
export function loadTemplates(overridesDir: string | null): TemplateSet {
  const set = readSet(DEFAULT_TEMPLATES_DIR, false);
  if (overridesDir === null) return set;
  if (!existsSync(overridesDir) || !statSync(overridesDir).isDirectory()) {
    throw new BriefError(
      'templates-missing',
      `the templates folder ${overridesDir} does not exist`,
      'check brief.templates: the path is relative to the job file',
      { file: overridesDir },
    );
  }
  // The folder may hold only other renderers' files (email.hbs): then nothing here is replaced.
  const over = readSet(overridesDir, true);
  return {
    main: over.main ?? set.main,
    css: over.css ?? set.css,
    partials: new Map([...set.partials, ...over.partials]),
  };
}

function readSet(dir: string, override: true): Partial<TemplateSet> & Pick<TemplateSet, 'partials'>;
function readSet(dir: string, override: false): TemplateSet;
function readSet(dir: string, override: boolean): Partial<TemplateSet> & Pick<TemplateSet, 'partials'> {
  const read = (name: string, file: string): TemplateSource | undefined => {
    if (!existsSync(file)) {
      if (override) return undefined;
      throw new BriefError('template-missing', `the built-in template ${file} is missing`, 'reinstall trendbrief', {
        file,
      });
    }
    return { name, file, override, text: readText(file) };
  };
  const partials = new Map<string, TemplateSource>();
  const pdir = join(dir, 'partials');
  if (existsSync(pdir) && statSync(pdir).isDirectory()) {
    for (const f of readdirSync(pdir).sort()) {
      if (f.endsWith('.hbs')) partials.set(f.slice(0, -4), read(f.slice(0, -4), join(pdir, f)) as TemplateSource);
    }
  }
  return { main: read('brief', join(dir, 'brief.hbs')), css: read('brief.css', join(dir, 'brief.css')), partials };
}

function readText(file: string): string {
  try {
    return readRegularFile(file)
      .toString('utf8')
      .replace(/^\uFEFF/, '');
  } catch (e) {
    if (e instanceof NotRegularFile) throw notOrdinary(file, e);
    throw new BriefError(
      'template-unreadable',
      `cannot read the template ${file} (${(e as NodeJS.ErrnoException).code ?? 'error'})`,
      'check the file’s permissions',
      { file },
    );
  }
}

/** A template that is a pipe, a device or a folder: refused before it is read (read-file.ts). */
export function notOrdinary(file: string, e: NotRegularFile): BriefError {
  return new BriefError(
    'template-not-file',
    `the template ${file} is ${e.kind}, not an ordinary file`,
    'save the template as an ordinary file in the templates folder',
    { file },
  );
}

/**
 * Parses every template and checks what handlebars would only find while rendering: partials that do not
 * exist, helpers that are not registered, decorators other than inline partials. Also keeps the CSS
 * self-contained. Throws the first problem as a BriefError.
 */
export function checkTemplates(set: TemplateSet, helpers: readonly string[]): void {
  const sources = [set.main, ...set.partials.values()];
  const inline = new Set<string>();
  // A built-in template unchanged since the build was checked then (scripts/precompile-templates.mjs), and
  // partials can only be added, never taken away: only its inline partial names matter here.
  const parsed: { src: TemplateSource; ast: hbs.AST.Program }[] = [];
  for (const src of sources) {
    const done = precompiledFor(src);
    if (done) for (const name of done.inline) inline.add(name);
    else parsed.push({ src, ast: parseTemplate(src) });
  }
  for (const { ast } of parsed) for (const name of inlinePartials(ast)) inline.add(name);
  const known = new Set<string>([...BUILTIN_HELPERS, ...helpers]);
  const partialNames = [...set.partials.keys()];
  for (const { src, ast } of parsed) {
    walk(ast, (n) => {
      // An empty block's program ({{#if x}}{{/if}}) has no location.
      const at = n.loc
        ? { file: src.file, line: n.loc.start.line, column: n.loc.start.column + 1 }
        : { file: src.file };
      if (n.type === 'PartialStatement') {
        const name = partialName(n.name as Node);
        if (name !== null && !set.partials.has(name) && !inline.has(name)) {
          throw new BriefError(
            'template-partial',
            `the partial "${name}" is not found`,
            `add partials/${name}.hbs to the templates folder, or use one of: ${partialNames.join(', ')}`,
            at,
          );
        }
      }
      if (n.type === 'Decorator' || n.type === 'DecoratorBlock') {
        const name = pathName(n.path);
        if (name !== 'inline') {
          throw new BriefError(
            'template-decorator',
            `unknown decorator "*${name}"`,
            'only {{#*inline "name"}} partials are available',
            at,
          );
        }
        return;
      }
      if (isHelperCall(n)) {
        const name = pathName(n.path);
        if (name !== null && !known.has(name)) {
          throw new BriefError(
            'template-helper',
            `unknown helper "${name}"`,
            `the helpers available are ${[...known].join(', ')}`,
            at,
          );
        }
      }
    });
  }
  checkCss(set.css);
}

/** Where a template includes the named partial ({{> name}}), 1-based; the first such place, or null. */
export function partialCall(src: TemplateSource, name: string): { line: number; column: number } | null {
  let found: { line: number; column: number } | null = null;
  walk(parseTemplate(src), (n) => {
    if (found === null && n.type === 'PartialStatement' && n.loc && partialName(n.name as Node) === name)
      found = { line: n.loc.start.line, column: n.loc.start.column + 1 };
  });
  return found;
}

/** Names of the inline partials a template defines ({{#*inline "name"}}). */
export function inlinePartials(ast: hbs.AST.Program): string[] {
  const names: string[] = [];
  walk(ast, (n) => {
    if (n.type === 'DecoratorBlock' && pathName(n.path) === 'inline') {
      const p = (n.params as Node[])[0];
      if (p?.type === 'StringLiteral') names.push(String(p.value));
    }
  });
  return names;
}

/** The CSS goes into a <style> element verbatim: it must not fetch anything or close the element early. */
function checkCss(css: TemplateSource): void {
  if (cssCheckedAtBuild(css)) return;
  const problem = cssProblem(css.text);
  if (problem) {
    throw new BriefError(
      'template-css',
      `the stylesheet ${problem.what}; the brief must stay one self-contained file`,
      'inline the resource as a data: URI or remove it',
      { file: css.file, line: problem.line, column: problem.column },
    );
  }
}

type Node = hbs.AST.Node & Record<string, unknown>;

/** Handlebars' parse, with its two kinds of error (parser and AST checks) turned into one located line. */
export function parseTemplate(src: TemplateSource): hbs.AST.Program {
  try {
    return Handlebars.parse(src.text);
  } catch (e) {
    throw syntaxError(src, e as Error & { lineNumber?: number; column?: number });
  }
}

function syntaxError(src: TemplateSource, e: Error & { lineNumber?: number; column?: number }): BriefError {
  const hint = 'check that every {{ has its }} and every {{#block}} is closed by the matching {{/block}}';
  // Parser errors read "Parse error on line 3:\n<excerpt>\n----^\nExpecting 'A', 'B', got 'EOF'".
  const m = /^Parse error on line (\d+):\n(.*)\n.*\nExpecting (.*), got '([^']+)'/.exec(e.message);
  if (m) {
    const near = m[2].trim().slice(-40);
    const expecting = m[3].split(', ').map((t) => t.replace(/'/g, ''));
    return new BriefError(
      'template-syntax',
      `template syntax error near "${near}": ${parseProblem(m[4], expecting)}`,
      hint,
      {
        file: src.file,
        line: Number(m[1]),
      },
    );
  }
  // AST checks read "if doesn't match each - 3:3".
  const first = e.message.split('\n')[0].replace(/ - \d+:\d+$/, '');
  const mismatch = /^(\S+) doesn't match (\S+)$/.exec(first);
  const message = mismatch ? `the block {{#${mismatch[1]}}} is closed by {{/${mismatch[2]}}}` : first;
  const place =
    e.lineNumber === undefined
      ? { file: src.file }
      : { file: src.file, line: e.lineNumber, column: (e.column ?? 0) + 1 };
  return new BriefError('template-syntax', `template syntax error: ${message}`, hint, place);
}

/** The parser's token names in the words a template author uses. */
const TOKENS: Record<string, string> = {
  EOF: 'the end of the file',
  CLOSE: '}}',
  CLOSE_UNESCAPED: '}}}',
  OPEN_ENDBLOCK: '{{/…}}',
  INVERSE: '{{else}}',
  OPEN_INVERSE_CHAIN: '{{else …}}',
  OPEN_BLOCK: '{{#…}}',
  OPEN: '{{',
  OPEN_UNESCAPED: '{{{',
  OPEN_PARTIAL: '{{>',
  OPEN_SEXPR: '(',
  CLOSE_SEXPR: ')',
  EQUALS: '=',
  ID: 'a name',
};

function parseProblem(got: string, expecting: string[]): string {
  if (got === 'EOF' && expecting.includes('OPEN_ENDBLOCK')) return 'a {{#block}} is never closed by its {{/block}}';
  if (got === 'EOF' && expecting.includes('CLOSE')) return 'a {{ tag is not closed by }}';
  if (got === 'CLOSE' && expecting.includes('CLOSE_UNESCAPED')) return 'a {{{ tag is closed by }} instead of }}}';
  if (got === 'OPEN_ENDBLOCK' && expecting.includes('EOF')) return 'a {{/block}} closes no open block';
  return `unexpected ${TOKENS[got] ?? got.toLowerCase().replace(/_/g, ' ')}`;
}

function walk(node: unknown, visit: (n: Node) => void): void {
  if (Array.isArray(node)) {
    for (const x of node) walk(x, visit);
    return;
  }
  if (node === null || typeof node !== 'object' || !('type' in node)) return;
  const n = node as Node;
  visit(n);
  // Literals' and content's `value` is a plain string, so walking it is harmless; a hash pair's is a node.
  for (const key of ['body', 'path', 'name', 'params', 'hash', 'pairs', 'value', 'program', 'inverse'])
    walk(n[key], visit);
}

/** The same rule handlebars' compiler uses: a sub-expression, or a mustache/block with arguments. */
function isHelperCall(n: Node): boolean {
  if (n.type === 'SubExpression') return true;
  if (n.type !== 'MustacheStatement' && n.type !== 'BlockStatement') return false;
  const hash = n.hash as hbs.AST.Hash | undefined;
  return (n.params as unknown[]).length > 0 || (hash !== undefined && hash.pairs.length > 0);
}

function pathName(p: unknown): string | null {
  const path = p as hbs.AST.PathExpression;
  if (path?.type !== 'PathExpression' || path.data || path.parts.length !== 1) return null;
  return path.original;
}

function partialName(n: Node): string | null {
  if (n.type === 'PathExpression') {
    const original = String((n as unknown as hbs.AST.PathExpression).original);
    return original.startsWith('@') ? null : original;
  }
  if (n.type === 'StringLiteral' || n.type === 'NumberLiteral') return String(n.value);
  // A dynamic partial, {{> (lookup …)}}, is only known while rendering.
  return null;
}
