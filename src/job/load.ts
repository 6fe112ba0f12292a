/**
 * Reading a job file: its bytes and their SHA-256, the YAML with every node's position, the schema and
 * content checks, then the defaults. Every mistake found is reported at once, each as
 * `file:line:col: what — how to fix it`, pointing at the offending value (a missing key: its mapping; an
 * unknown key: the key itself).
 */
import { createHash } from 'node:crypto';
import { statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import {
  type Alias,
  type CST,
  type Document,
  isMap,
  isScalar,
  isSeq,
  LineCounter,
  type Node,
  Parser,
  parseDocument,
  visit,
  type YAMLError,
  type YAMLMap,
} from 'yaml';
import { BriefError, BriefErrors, type Place } from '../errors.js';
import { NotRegularFile, readRegularFile } from '../read-file.js';
import { firstInvalidUtf8 } from '../utf8.js';
import type { Job } from '../vocabulary/settings.js';
import { resolveJob } from './defaults.js';
import { rememberSource } from './place.js';
import { renamedProblems } from './renamed.js';
import { type Problem, type RawJob, shapeProblems } from './schema.js';
import { controlCharacterProblems } from './text.js';
import { contentProblems } from './validate.js';

/** Loads, checks and resolves a job file; `path` is also how messages name the file. */
export function loadJob(path: string): Job {
  const bytes = readJobBytes(path);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    // The line and column (in bytes) of the first byte that is not UTF-8.
    const at = firstInvalidUtf8(bytes);
    const lineStart = at > 0 ? bytes.lastIndexOf(10, at - 1) + 1 : 0;
    const line = bytes.subarray(0, lineStart).filter((b) => b === 10).length + 1;
    throw new BriefError('job-encoding', `${path} is not UTF-8 text`, 'save the job file as UTF-8', {
      file: path,
      line,
      column: at - lineStart + 1,
    });
  }
  tooDeepBeforeParsing(text, path);
  const lineCounter = new LineCounter();
  // The core schema keeps 2026-09-01 a string (no timestamps), so periods stay exactly as written.
  // logLevel 'error': a warning (a list used as a key) would go to stderr as extra lines; the unknown key
  // it becomes is reported anyway.
  const doc = parseDocument(text, {
    lineCounter,
    prettyErrors: false,
    schema: 'core',
    // Duplicate keys are found by checkStructure, in linear time.
    uniqueKeys: false,
    logLevel: 'error',
  });
  if (doc.errors.length > 0) {
    // One mistake often upsets the parser several times, on its line and the next ones (a line indented
    // too little in a list ends the item early); the first complaint is the useful one.
    throw yamlError(doc.errors[0], path, lineCounter);
  }
  if (doc.contents === null) {
    throw new BriefError('job-empty', 'the job file is empty', 'start it with brief: (a title) and series: (a list)', {
      file: path,
      line: 1,
      column: 1,
    });
  }
  checkStructure(doc, path, lineCounter);
  textAsWritten(doc);
  const data = toData(doc, path, lineCounter);
  const file = resolve(path);
  const dir = resolve(file, '..');
  // An old name gets one message naming its replacement, not the schema's complaint about that comparison.
  const renamed = renamedProblems(data);
  const renamedAt = new Set(renamed.map((p) => p.path.slice(0, 2).join('/')));
  const shape = [
    ...renamed,
    ...shapeProblems(data).filter((p) => !(p.path[0] === 'comparisons' && renamedAt.has(p.path.slice(0, 2).join('/')))),
  ];
  // A value the schema already rejected needs no second message from the content checks.
  const taken = new Set(shape.map((p) => p.path.join('/')));
  const problems = [
    ...shape,
    ...controlCharacterProblems(data),
    ...contentProblems(data, dir).filter((p) => !taken.has(p.path.join('/'))),
  ];
  if (problems.length > 0) {
    const errors = problems.map((p) => new BriefError(p.code, p.message, p.hint, placeOf(doc, lineCounter, path, p)));
    errors.sort((a, b) => (a.place.line ?? 0) - (b.place.line ?? 0) || (a.place.column ?? 0) - (b.place.column ?? 0));
    throw collect(errors);
  }
  const job = resolveJob(data as RawJob, file, sha256);
  rememberSource(job, doc, lineCounter);
  return job;
}

export { placeInJob } from './place.js';

/**
 * The document as plain data. Aliases are only resolved here: one naming no anchor, or so many that they
 * multiply the document (a resource-exhaustion attack), is reported at the first alias.
 */
function toData(doc: Document, file: string, lines: LineCounter): unknown {
  try {
    return doc.toJS({ maxAliasCount: 100 });
  } catch (e) {
    let at: Alias | undefined;
    let unresolved: Alias | undefined;
    visit(doc, {
      Alias(_, node) {
        at ??= node;
        if (!unresolved && node.resolve(doc) === undefined) unresolved = node;
      },
    });
    const node = unresolved ?? at;
    const { line, col } = lines.linePos(node?.range?.[0] ?? 0);
    const [what, fix] = unresolved
      ? [`the alias *${unresolved.source} names no anchor`, 'define the anchor (&name) before using it']
      : /alias count/i.test((e as Error).message)
        ? ['the aliases (*name) repeat the document too many times', 'write the values out instead of nesting aliases']
        : [lowerFirst(String((e as Error).message).split('\n')[0]), 'check the anchors (&name) and aliases (*name)'];
    throw new BriefError('job-yaml', what, fix, { file, line, column: col });
  }
}

/** A job file nests a few levels; this many would only exhaust the call stack of later steps. */
export const MAX_DEPTH = 64;

const TOO_DEEP: [string, string] = [
  `the lists and mappings are nested more than ${MAX_DEPTH} levels deep`,
  'a job file needs a few levels: check for a [ or { that is never closed, or indentation that keeps growing',
];

/**
 * The nesting of lists and mappings, measured on yaml's concrete syntax tree (its parser keeps a stack of
 * its own; the composer that builds the document recurses, and overflows the call stack somewhere past a
 * thousand levels, at a place that depends on the stack's size). The first collection deeper than MAX_DEPTH
 * is reported where it starts.
 */
function tooDeepBeforeParsing(text: string, file: string): void {
  // Few files nest at all deeply; only those with many brackets or deep indentation are measured.
  if (text.length < 4 * MAX_DEPTH) return;
  const stack: [CST.Token | undefined, number][] = [];
  for (const token of new Parser().parse(text)) stack.push([token, 0]);
  stack.reverse();
  while (stack.length > 0) {
    const [token, depth] = stack.pop() as [CST.Token | undefined, number];
    if (!token) continue;
    if (token.type === 'document') {
      stack.push([token.value, depth]);
      continue;
    }
    if (token.type !== 'block-map' && token.type !== 'block-seq' && token.type !== 'flow-collection') continue;
    if (depth + 1 > MAX_DEPTH) {
      const lines = new LineCounter();
      lines.addNewLine(0);
      for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) lines.addNewLine(i + 1);
      const { line, col } = lines.linePos(token.offset);
      throw new BriefError('job-too-deep', TOO_DEEP[0], TOO_DEEP[1], { file, line, column: col });
    }
    const items = token.items as { key?: CST.Token | null; value?: CST.Token }[];
    for (let i = items.length - 1; i >= 0; i--)
      stack.push([items[i].value, depth + 1], [items[i].key ?? undefined, depth + 1]);
  }
}

/**
 * Two checks on the document's structure, in one walk with a stack of our own (so a deep file cannot
 * overflow the call stack): the first node nested deeper than MAX_DEPTH, and the first key written twice in
 * one mapping. yaml's own duplicate check (`uniqueKeys`) compares each key with every key before it, which
 * took seconds on a mapping of ten thousand keys; a set per mapping takes milliseconds.
 */
function checkStructure(doc: Document, file: string, lines: LineCounter): void {
  let first: { offset: number; error: [string, string, string] } | null = null;
  const found = (offset: number, error: [string, string, string]): void => {
    if (first === null || offset < first.offset) first = { offset, error };
  };
  const stack: [unknown, number][] = [[doc.contents, 1]];
  while (stack.length > 0) {
    const [node, depth] = stack.pop() as [unknown, number];
    if (!isMap(node) && !isSeq(node)) continue;
    if (depth > MAX_DEPTH) {
      found(node.range?.[0] ?? 0, ['job-too-deep', ...TOO_DEEP]);
      continue;
    }
    if (isMap(node)) {
      const seen = new Set<string>();
      for (const pair of node.items) {
        if (!isScalar(pair.key) || pair.key.value === '<<') continue;
        const key = `${typeof pair.key.value}:${String(pair.key.value)}`;
        if (seen.has(key)) found(pair.key.range?.[0] ?? 0, ['job-yaml', ...DUPLICATE_KEY]);
        seen.add(key);
      }
      for (let i = node.items.length - 1; i >= 0; i--)
        stack.push([node.items[i].value, depth + 1], [node.items[i].key, depth + 1]);
    } else for (let i = node.items.length - 1; i >= 0; i--) stack.push([node.items[i], depth + 1]);
  }
  if (first === null) return;
  const { offset, error } = first as { offset: number; error: [string, string, string] };
  const { line, col } = lines.linePos(offset);
  throw new BriefError(error[0], error[1], error[2], { file, line, column: col });
}

const DUPLICATE_KEY: [string, string] = ['this key appears twice in the same mapping', 'keep one of them'];

function collect(errors: BriefError[]): BriefError {
  return errors.length === 1 ? errors[0] : new BriefErrors(errors);
}

function readJobBytes(path: string): Buffer {
  let isDir = false;
  try {
    isDir = statSync(path).isDirectory();
  } catch {
    throw new BriefError('job-not-found', `job file ${path} not found`, 'check the path and the current folder', {
      file: path,
    });
  }
  if (isDir) {
    const inside = ['job.yaml', 'job.yml']
      .map((n) => join(path, n))
      .find((p) => statSync(p, { throwIfNoEntry: false }));
    const hint = inside ? `did you mean ${inside}?` : 'give the path of the .yaml file itself';
    throw new BriefError('job-not-found', `${path} is a folder, not a job file`, hint, { file: path });
  }
  try {
    return readRegularFile(path);
  } catch (e) {
    if (e instanceof NotRegularFile) {
      throw new BriefError(
        'job-not-file',
        `${path} is ${e.kind}, not an ordinary file`,
        'save the job as an ordinary .yaml file and name that',
        { file: path },
      );
    }
    const reason = (e as NodeJS.ErrnoException).code === 'EACCES' ? 'permission denied' : String(e);
    throw new BriefError('job-unreadable', `job file ${path} cannot be read (${reason})`, 'check its permissions', {
      file: path,
    });
  }
}

/** YAML's complaint in plain words, at the place it was found. */
function yamlError(e: YAMLError, file: string, lines: LineCounter): BriefError {
  const { line, col } = lines.linePos(e.pos[0]);
  const unclosed = /end with an? ([\]}])/.exec(e.message)?.[1];
  // The parser gives up deep inside a nesting too deep for the call stack, and says so at that place.
  if (/call stack/i.test(e.message))
    return new BriefError('job-too-deep', TOO_DEEP[0], TOO_DEEP[1], { file, line, column: col });
  const [what, fix] = unclosed
    ? [`a ${unclosed === ']' ? '[ list' : '{ mapping'} is not closed`, `add the ${unclosed} where it ends`]
    : /without - indicator/.test(e.message)
      ? [
          'this line is indented less than the keys above it, so it reads as a list item without its "-"',
          'indent it by the same number of spaces as the keys beside it',
        ]
      : (YAML_WORDS[e.code] ?? [lowerFirst(e.message), 'check the indentation and the colon after each key']);
  return new BriefError('job-yaml', what, fix, { file, line, column: col });
}

const YAML_WORDS: Partial<Record<YAMLError['code'], [string, string]>> = {
  BAD_INDENT: [
    'the indentation does not line up',
    'indent each key by the same number of spaces as the keys beside it',
  ],
  TAB_AS_INDENT: ['a tab is used to indent', 'indent with spaces only'],
  DUPLICATE_KEY,
  BLOCK_AS_IMPLICIT_KEY: [
    'a value runs on into a line that holds a key',
    'check the indentation: keys beside each other start in the same column',
  ],
  MULTILINE_IMPLICIT_KEY: [
    'a key runs over more than one line',
    'check the indentation of the next line: keys beside each other start in the same column',
  ],
  BAD_SCALAR_START: ['a value starts with a character YAML reserves', 'put the value in quotes'],
  MULTIPLE_DOCS: ['the file holds more than one YAML document (a --- line)', 'keep one job per file'],
  BAD_DQ_ESCAPE: [
    'an unknown backslash escape in double-quoted text',
    'use single quotes, or write \\\\ for a backslash',
  ],
  BAD_ALIAS: ['an alias (*name) that names no anchor', 'define the anchor (&name) before using it'],
  MISSING_CHAR: ['a closing bracket, brace or quote is missing', 'close every [, { and quote on the same item'],
};

function lowerFirst(s: string): string {
  return s.charAt(0).toLowerCase() + s.slice(1);
}

/**
 * Text where text is expected: a filter value written `equals: 2024` or `equals: 007` is compared with
 * the data as text, so it keeps the characters written rather than the number YAML reads.
 */
function textAsWritten(doc: Document): void {
  const series = doc.get('series', true);
  if (!isSeq(series)) return;
  for (const item of series.items) {
    if (!isMap(item)) continue;
    const equals = item.getIn(['data', 'filter', 'equals'], true);
    const scalars = isSeq(equals) ? equals.items : [equals];
    for (const s of scalars) {
      if (isScalar(s) && (typeof s.value === 'number' || typeof s.value === 'boolean') && s.source !== undefined) {
        s.value = s.source;
      }
    }
  }
}

/** Each mapping's key nodes by their text, found once: a file of many unknown keys is placed in linear time. */
const keyNodes = new WeakMap<object, Map<string, Node>>();

function keysOf(map: YAMLMap): Map<string, Node> {
  let keys = keyNodes.get(map);
  if (!keys) {
    keys = new Map();
    for (const pair of map.items) {
      if (!isScalar(pair.key)) continue;
      const text = String(pair.key.value);
      if (!keys.has(text)) keys.set(text, pair.key as Node);
    }
    keyNodes.set(map, keys);
  }
  return keys;
}

/** Line and column of a problem: the node at its path, or the nearest ancestor that exists. */
function placeOf(doc: Document, lines: LineCounter, file: string, p: Problem): Place {
  let node: Node | null | undefined;
  if (p.at === 'key' && p.path.length > 0) {
    const parent = doc.getIn(p.path.slice(0, -1), true);
    const key = String(p.path[p.path.length - 1]);
    if (isMap(parent)) node = keysOf(parent).get(key);
  }
  for (let n = p.path.length; !node?.range && n >= 0; n--) {
    const found = n === 0 ? doc.contents : doc.getIn(p.path.slice(0, n), true);
    node = found && typeof found === 'object' && 'range' in found ? (found as Node) : undefined;
  }
  const offset = node?.range?.[0] ?? 0;
  const { line, col } = lines.linePos(offset);
  return { file, line, column: col };
}
