/**
 * The HTML brief's stylesheet goes into a <style> element as written, and the brief must stay one
 * self-contained file: nothing in it may make a browser fetch anything. A search of the text for "url(" or
 * "@import" is not enough, because CSS lets any character of a name be written as an escape: `u\72l(…)` is
 * url(…) and `@\69mport` is @import (CSS Syntax Level 3, §4.3.7 and §4.3.4: escapes are undone before a
 * name is compared). So the stylesheet is read with a CSS parser (css-tree), and each at-rule, function
 * and url is judged by its name and value after unescaping. Allowed: data: URIs and same-document
 * references (#id). Refused: @import, url(), src(), image-set(), image() and cross-fade() of anything else,
 * the same inside custom properties, and text the parser cannot read (a browser would skip it, but it
 * could hide any of these).
 */
import { createRequire } from 'node:module';
import type { CssNode, SyntaxParseError } from 'css-tree';

// css-tree is some 120 modules: loaded (its CommonJS build, synchronously) only when a stylesheet is read,
// which a brief with the built-in stylesheet never needs (templates.ts `checkCss`).
type CssTree = typeof import('css-tree');
let cssTree: CssTree | null = null;
const loadCssTree = (): CssTree => {
  cssTree ??= createRequire(import.meta.url)('css-tree') as CssTree;
  return cssTree;
};

export interface CssProblem {
  /** Line (1-based) of the offending text. */
  line: number;
  column: number;
  /** What the stylesheet does, to follow "the stylesheet …". */
  what: string;
}

/** Functions whose arguments (strings or urls) name images or files to load. */
const FETCHING = new Set(['url', 'src', 'image-set', '-webkit-image-set', 'image', 'cross-fade', '-webkit-cross-fade']);

function allowed(address: string): boolean {
  const a = address.trim().toLowerCase();
  return a.startsWith('data:') || a.startsWith('#');
}

/** The first thing in the stylesheet that would fetch something or break out of <style>, or null. */
export function cssProblem(text: string): CssProblem | null {
  const closing = /<\/style/i.exec(text);
  if (closing) return { ...lineCol(text, closing.index), what: 'contains </style' };
  const { ident, parse, walk } = loadCssTree();
  let problem: CssProblem | null = null;
  const found = (p: CssProblem): void => {
    if (!problem || p.line < problem.line || (p.line === problem.line && p.column < problem.column)) problem = p;
  };
  const ast = parse(text, {
    positions: true,
    parseCustomProperty: true,
    onParseError: (e: SyntaxParseError) =>
      found({ line: e.line, column: e.column, what: `cannot be read here (${e.message.replace(/\.$/, '')})` }),
  });
  // The enclosing fetching function of the node being visited, by depth.
  const within: (string | null)[] = [];
  walk(ast, {
    enter(node: CssNode) {
      const at = node.loc ? { line: node.loc.start.line, column: node.loc.start.column } : { line: 1, column: 1 };
      if (node.type === 'Atrule' && ident.decode(node.name).toLowerCase() === 'import') {
        found({ ...at, what: 'uses @import' });
      } else if (node.type === 'Url' && !allowed(node.value)) {
        found({ ...at, what: 'refers to a file or address with url(…)' });
      } else if (node.type === 'Function') {
        const name = ident.decode(node.name).toLowerCase();
        within.push(FETCHING.has(name) ? name : null);
        return;
      } else if (node.type === 'String' && within.some((n) => n !== null) && !allowed(node.value)) {
        const name = within.filter((n) => n !== null).pop();
        found({ ...at, what: `refers to a file or address with ${name}(…)` });
      } else if (node.type === 'Raw' && fetchesInRaw(node.value)) {
        found({ ...at, what: 'refers to a file or address in text it cannot read as CSS' });
      }
    },
    leave(node: CssNode) {
      if (node.type === 'Function') within.pop();
    },
  });
  return problem;
}

/** Raw text (what the parser keeps unparsed) unescaped, then searched for a fetching name. */
function fetchesInRaw(raw: string): boolean {
  const text = undoEscapes(raw).toLowerCase();
  if (/@import\b/.test(text)) return true;
  for (const m of text.matchAll(/([a-z-]+)\s*\(\s*(['"]?)([^'")\s]*)/g)) {
    if (FETCHING.has(m[1]) && !allowed(m[3])) return true;
  }
  return false;
}

/** CSS escapes undone (CSS Syntax Level 3, §4.3.7): `\72` and `\72 ` are "r", `\(` is "(". */
function undoEscapes(s: string): string {
  return s.replace(/\\([0-9a-fA-F]{1,6})[ \t\n\f\r]?|\\([^\n0-9a-fA-F])/g, (_, hex: string, ch: string) =>
    hex ? String.fromCodePoint(Math.min(Number.parseInt(hex, 16), 0x10ffff) || 0xfffd) : ch,
  );
}

function lineCol(text: string, index: number): { line: number; column: number } {
  const before = text.slice(0, index);
  const line = before.split('\n').length;
  return { line, column: index - before.lastIndexOf('\n') };
}
