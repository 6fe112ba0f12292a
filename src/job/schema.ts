/**
 * The job file's JSON Schema (schema/job.schema.json), compiled once; what it admits; its findings in plain
 * words; and the Markdown key reference generated from it. The schema is the one list of keys, allowed
 * values and defaults: unknown-key suggestions and the wording of value errors (its `x-expects` and `x-hint`
 * annotations) come from it too.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import type { Ajv2020, ErrorObject, ValidateFunction } from 'ajv/dist/2020.js';
import { closest } from '../suggest.js';
import { makeJobValidator, SCHEMA_SHA256 } from './validator.generated.js';

/** A schema node as this module reads it; the annotations are ours and ignored by editors. */
export interface SchemaNode {
  $ref?: string;
  description?: string;
  type?: string;
  properties?: Record<string, SchemaNode>;
  required?: string[];
  items?: SchemaNode;
  anyOf?: SchemaNode[];
  enum?: unknown[];
  const?: unknown;
  default?: unknown;
  'x-expects'?: string;
  'x-hint'?: string;
  'x-default-text'?: string;
  [keyword: string]: unknown;
}

/** The shape the schema admits, before defaults (snake_case, as written). */
export interface RawDecomposition {
  method?: 'classical' | 'stl' | 'mstl';
  model?: 'auto' | 'additive' | 'multiplicative';
  period?: number;
  periods?: number[];
  seasonal_window?: number | 'periodic' | (number | 'periodic')[];
  seasonal_degree?: 0 | 1;
  trend_window?: number;
  trend_degree?: 0 | 1;
  lowpass_window?: number;
  lowpass_degree?: 0 | 1;
  robust?: boolean;
  inner?: number;
  outer?: number;
  iterations?: number;
  henderson?: number | false;
  extend?: 'auto' | 'on' | 'off' | number;
  match_yearly_totals?: boolean;
}

/** Effects taken out before the decomposition (calendar, named events, the search for others). */
export interface RawEffects {
  days?: 'working' | 'each_weekday' | 'none';
  leap_year?: boolean;
  easter_days?: number | false;
  holidays?: string;
  holiday_file?: string;
  events?: RawEvent[];
  find?: 'auto' | 'on' | 'off';
  find_kinds?: ('one_off' | 'step' | 'fading')[];
}

export interface RawEvent {
  kind: 'step' | 'fading' | 'one_off' | 'ramp';
  at: string;
  until?: string;
  label: string;
  fading_rate?: number;
}

export interface RawSeries {
  id: string;
  label: string;
  unit?: string;
  combine?: 'sum' | 'mean';
  good?: 'up' | 'down' | 'neither';
  change_as?: 'auto' | 'percent' | 'units';
  data: {
    file?: string;
    format?: 'csv' | 'json' | 'xlsx' | 'sqlite';
    sheet?: string | number;
    range?: string;
    header_row?: number;
    connection_env?: string;
    query?: string;
    parameters?: ('period' | 'period_start' | 'period_end')[];
    timeout?: number;
    date: string;
    value: string;
    filter?: { column: string; equals: string | string[] };
    group_by?: string;
    decimal?: '.' | ',';
    delimiter?: string;
  };
  frequency?: 'hourly' | 'daily' | 'weekly' | 'monthly' | 'quarterly';
  decomposition?: RawDecomposition;
  effects?: RawEffects;
  firmness?: { periods?: number };
}

export type RawBuiltinKind = 'year_on_year' | 'year_to_date' | 'fiscal_year_to_date' | 'latest_year';

export type RawComparison =
  | RawBuiltinKind
  | { [K in RawBuiltinKind]?: { label: string } }
  | { custom: { label: string; current: [string, string]; baseline: [string, string] } };

export interface RawJob {
  brief: {
    title: string;
    organisation?: string;
    author?: string;
    contact?: string;
    period?: string;
    locale?: string;
    fiscal_year_start?: number;
    outputs?: ('html' | 'pdf' | 'eml' | 'json')[];
    chart_files?: ('svg' | 'png')[];
    page_size?: 'A4' | 'Letter';
    pdf_engine?: 'builtin' | 'browser';
    pdf_archival?: boolean;
    accent?: string;
    sections?: ('overview' | 'series' | 'cautions' | 'method' | 'data')[];
    series_sections?: ('headline' | 'key_figures' | 'notes' | 'charts' | 'comparisons' | 'unusual' | 'firmness')[];
    data_periods?: number | 'all';
    logo?: string;
    templates?: string;
    email?: { subject?: string; from?: string; to?: string[]; cc?: string[] };
  };
  series: RawSeries[];
  comparisons?: RawComparison[];
  defaults?: {
    combine?: 'sum' | 'mean';
    good?: 'up' | 'down' | 'neither';
    change_as?: 'auto' | 'percent' | 'units';
    unit?: string;
    frequency?: 'hourly' | 'daily' | 'weekly' | 'monthly' | 'quarterly';
    decomposition?: RawDecomposition;
    effects?: RawEffects;
  };
  record?: {
    store?: 'sqlite' | 'postgres' | 'none';
    file?: string;
    connection_env?: string;
    name?: string;
    required?: boolean;
  };
}

/** Path of the schema file: the package root is two levels above both src/job/ and dist/job/. */
export const SCHEMA_PATH = fileURLToPath(new URL('../../schema/job.schema.json', import.meta.url));

let schemaCache: SchemaNode | null = null;
let schemaSha: string | null = null;
let validateCache: ValidateFunction | null = null;

export function jobSchema(): SchemaNode {
  if (!schemaCache) {
    const text = readFileSync(SCHEMA_PATH, 'utf8');
    schemaSha = createHash('sha256').update(text).digest('hex');
    schemaCache = JSON.parse(text) as SchemaNode;
  }
  return schemaCache;
}

/**
 * The validator; `verbose` so each error carries its data and schema. Speed: the code ajv would compile is
 * committed, generated (validator.generated.ts, by scripts/job-validator.mjs), which saves compiling the
 * schema at every start; should the schema file differ from the one it was generated from, ajv compiles
 * the file as it is.
 */
export function jobValidator(): ValidateFunction {
  if (!validateCache) {
    const schema = jobSchema();
    validateCache =
      schemaSha === SCHEMA_SHA256 ? (makeJobValidator(schema) as ValidateFunction) : compileValidator(schema);
  }
  return validateCache;
}

/** ajv compiling the schema at run time, with the options the generated code was made with. */
export function compileValidator(schema: SchemaNode): ValidateFunction {
  const require = createRequire(import.meta.url);
  const { Ajv2020: Ajv } = require('ajv/dist/2020.js') as { Ajv2020: typeof Ajv2020 };
  const ajv = new Ajv({ allErrors: true, verbose: true, strict: true, strictRequired: false });
  ajv.addVocabulary(['x-expects', 'x-hint', 'x-default-text']);
  return ajv.compile(schema);
}

/** Runs the schema; an empty list when the data conforms. */
export function schemaErrors(data: unknown): ErrorObject[] {
  const validate = jobValidator();
  return validate(data) ? [] : [...(validate.errors ?? [])];
}

let pointers: Map<object, string> | null = null;

/**
 * The absolute JSON pointer of a schema node, found by identity. ajv's own `schemaPath` is relative to the
 * `$defs` entry it compiled separately, so errors are placed through their `parentSchema` instead.
 */
export function pointerOf(node: object): string | undefined {
  if (!pointers) {
    const map = new Map<object, string>();
    const walk = (value: unknown, pointer: string): void => {
      if (value === null || typeof value !== 'object') return;
      map.set(value, pointer);
      for (const [key, child] of Object.entries(value)) walk(child, `${pointer}/${key}`);
    };
    walk(jobSchema(), '');
    pointers = map;
  }
  return pointers.get(node);
}

/** The node a local `$ref` points to, or the node itself. */
export function resolveRef(node: SchemaNode): SchemaNode {
  let n = node;
  for (let hops = 0; n.$ref && hops < 10; hops++) {
    const target = nodeAtPointer(n.$ref.replace(/^#/, ''));
    if (!target) break;
    n = target;
  }
  return n;
}

/** The schema node at a JSON pointer such as `/properties/brief` (ajv's schemaPath without the `#`). */
export function nodeAtPointer(pointer: string): SchemaNode | undefined {
  let node: unknown = jobSchema();
  for (const raw of pointer.split('/').slice(1)) {
    const seg = decodeURIComponent(raw).replace(/~1/g, '/').replace(/~0/g, '~');
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[seg];
  }
  return node !== null && typeof node === 'object' ? (node as SchemaNode) : undefined;
}

/**
 * The schema of the value at an instance path (`['series', 0, 'data']`), following `$ref`s, array items and
 * the branches of `anyOf` that declare the key.
 */
export function schemaAt(path: readonly (string | number)[]): SchemaNode | undefined {
  let node: SchemaNode | undefined = jobSchema();
  for (const seg of path) {
    if (!node) return undefined;
    node = childSchema(resolveRef(node), seg);
  }
  return node;
}

function childSchema(node: SchemaNode, seg: string | number): SchemaNode | undefined {
  if (typeof seg === 'number' || /^\d+$/.test(seg)) {
    if (node.items) return node.items;
  }
  const own = node.properties?.[String(seg)];
  if (own) return own;
  for (const branch of node.anyOf ?? []) {
    const found = childSchema(resolveRef(branch), seg);
    if (found) return found;
  }
  return undefined;
}

/** Keys allowed in the mapping a schema node describes (its own and those of its object branches). */
export function allowedKeys(node: SchemaNode): string[] {
  const n = resolveRef(node);
  const keys = Object.keys(n.properties ?? {});
  for (const branch of n.anyOf ?? []) keys.push(...allowedKeys(branch));
  return [...new Set(keys)];
}

/** Every mapping section of the job file with its keys, e.g. `series[].data` → file, format, …. */
let sections: { path: string; node: SchemaNode; keys: string[] }[] | null = null;

export function schemaSections(): { path: string; node: SchemaNode; keys: string[] }[] {
  sections ??= findSections();
  return sections;
}

function findSections(): { path: string; node: SchemaNode; keys: string[] }[] {
  const out: { path: string; node: SchemaNode; keys: string[] }[] = [];
  const seen = new Set<SchemaNode>();
  const walk = (raw: SchemaNode, path: string): void => {
    const node = resolveRef(raw);
    if (node.properties) {
      if (seen.has(node)) return;
      seen.add(node);
      out.push({ path, node, keys: Object.keys(node.properties) });
      for (const [key, child] of Object.entries(node.properties)) walk(child, path ? `${path}.${key}` : key);
    }
    if (node.items) walk(node.items, `${path}[]`);
    for (const branch of node.anyOf ?? []) walk(branch, path);
  };
  walk(jobSchema(), '');
  return out;
}

/**
 * The job file reference as Markdown, generated from the schema: one table per section (key, type or
 * allowed values, default, description). A section reached twice (decomposition in a series and in
 * defaults) is listed once and referred to.
 */
export function schemaKeyReference(): string {
  // First pass: the path at which each section is first reached; later mentions refer to it.
  const home = new Map<SchemaNode, string>();
  for (const s of schemaSections()) home.set(s.node, s.path);
  const rendered = new Set<SchemaNode>();
  const blocks: string[] = [];
  const walk = (raw: SchemaNode, path: string, required: readonly string[]): void => {
    const node = resolveRef(raw);
    if (node.properties && !rendered.has(node)) {
      rendered.add(node);
      const rows = Object.entries(node.properties).map(([key, child]) => {
        const target = resolveRef(child);
        const childPath = path ? `${path}.${key}` : key;
        const first = target.properties ? home.get(target) : undefined;
        const elsewhere = first !== undefined && first !== childPath ? first : undefined;
        const expects =
          (child['x-expects'] ?? target['x-expects'] ?? target.type ?? '') +
          (elsewhere === undefined ? '' : `; same keys as \`${elsewhere}\``);
        const fallback = target.properties && elsewhere === undefined ? 'see below' : '—';
        const dflt = defaultText(child, target, required.includes(key), fallback);
        const description = child.description ?? target.description ?? '';
        return `| \`${key}\` | ${cell(expects)} | ${cell(dflt)} | ${cell(description)} |`;
      });
      const title = path === '' ? 'Top level' : `\`${path}\``;
      const head = ['| Key | Type or allowed values | Default | Description |', '| --- | --- | --- | --- |'];
      blocks.push([`### ${title}`, '', ...head, ...rows].join('\n'));
      for (const [key, child] of Object.entries(node.properties)) {
        walk(child, path ? `${path}.${key}` : key, resolveRef(child).required ?? []);
      }
    }
    if (node.items) walk(node.items, `${path}[]`, resolveRef(node.items).required ?? []);
    for (const branch of node.anyOf ?? []) walk(branch, path, resolveRef(branch).required ?? []);
  };
  const root = jobSchema();
  walk(root, '', root.required ?? []);
  return `${blocks.join('\n\n')}\n`;
}

function defaultText(child: SchemaNode, target: SchemaNode, required: boolean, fallback: string): string {
  if (required) return 'required';
  const note = child['x-default-text'] ?? target['x-default-text'];
  if (note !== undefined) return note;
  const value = child.default ?? target.default;
  if (value === undefined) return fallback;
  if (Array.isArray(value)) return value.length === 0 ? '`[]`' : `\`[${value.join(', ')}]\``;
  if (value === '') return '`""`';
  return `\`${String(value)}\``;
}

function cell(text: string): string {
  return text.replace(/\|/g, '\\|').replace(/\n/g, ' ');
}

// The schema's findings, reworded from ajv's.

export type JobPath = (string | number)[];

export interface Problem {
  code: string;
  /** Where in the file: the value at `path`, or (`at: 'key'`) the key named by its last segment. */
  path: JobPath;
  at: 'value' | 'key';
  message: string;
  hint: string;
}

/** `series[0].decomposition`; the root is "the job file". */
export function pathText(path: readonly (string | number)[]): string {
  let out = '';
  for (const seg of path) out += typeof seg === 'number' ? `[${seg}]` : out ? `.${seg}` : seg;
  return out || 'the job file';
}

/** A value as the message quotes it. */
export function describeValue(value: unknown): string {
  if (value === null || value === undefined) return 'nothing';
  if (Array.isArray(value)) {
    return value.length === 0 ? 'an empty list' : `a list of ${value.length} ${value.length === 1 ? 'item' : 'items'}`;
  }
  if (typeof value === 'object') return 'a mapping';
  // A long text is cut (at a character, never inside a surrogate pair), so the message stays one short line.
  if (typeof value === 'string')
    return JSON.stringify(value.length > 60 ? `${Array.from(value.slice(0, 58)).slice(0, 57).join('')}…` : value);
  return String(value);
}

/** An ajv error with the absolute pointer of its keyword in the schema (`/$defs/data/properties/file/type`). */
interface Located extends ErrorObject {
  at: string;
}

/**
 * The schema's errors reworded, one per place: unknown keys, missing keys, wrong values. Linear in the number
 * of errors (a file of ten thousand unknown keys has as many): the few `anyOf` errors and the `type` errors
 * of their branches are indexed once, not searched for each error.
 */
export function shapeProblems(data: unknown): Problem[] {
  const errors: Located[] = schemaErrors(data).map((e) => ({
    ...e,
    at: `${pointerOf(e.parentSchema as object) ?? ''}/${e.keyword}`,
  }));
  const branches = branchIndex(errors);
  const problems: Problem[] = [];
  const valueAt = new Set<string>();
  for (const e of errors) {
    if (e.keyword === 'if' || underDeadBranch(e, branches)) continue;
    // The root's if/else only makes combine required when defaults has none; its type checks repeat others.
    if (e.at.startsWith('/else/') && e.keyword !== 'required') continue;
    const path = instancePath(e.instancePath, data);
    if (e.keyword === 'additionalProperties') {
      problems.push(unknownKey(path, String(e.params.additionalProperty), e.parentSchema as SchemaNode));
    } else if (e.keyword === 'required') {
      problems.push(missingKey(path, String(e.params.missingProperty)));
    } else if (e.keyword === 'anyOf' && hasLiveBranch(e, branches)) {
      // A branch of the right type failed; its own errors say why.
    } else if (!valueAt.has(e.instancePath)) {
      // One message per value: `minimum` and `not` on the same number say the same thing.
      valueAt.add(e.instancePath);
      problems.push(wrongValue(path, e));
    }
  }
  return problems;
}

function unknownKey(path: JobPath, key: string, parent: SchemaNode | undefined): Problem {
  const keys = parent ? allowedKeys(parent) : [];
  const near = closest(key, keys);
  const home = near ? undefined : schemaSections().find((s) => s.keys.includes(key));
  const where = path.length === 0 ? 'at the top level' : `in ${pathText(path)}`;
  const hint = near
    ? `did you mean "${near}"?`
    : home
      ? `"${key}" belongs in ${home.path || 'the top level'}; move it there`
      : `keys allowed here: ${keys.join(', ')}`;
  return { code: 'job-unknown-key', path: [...path, key], at: 'key', message: `unknown key "${key}" ${where}`, hint };
}

function missingKey(path: JobPath, key: string): Problem {
  const hint = schemaAt([...path, key])?.['x-hint'] ?? `add ${key}:`;
  return {
    code: 'job-missing-key',
    path,
    at: 'value',
    message: `${pathText(path)} is missing the required key "${key}"`,
    hint: hint.replace(/^write /, 'add '),
  };
}

function wrongValue(path: JobPath, e: Located): Problem {
  const node = annotated(e.at);
  const expects = node?.['x-expects'] ?? 'of another kind';
  let hint = node?.['x-hint'] ?? '';
  let message = `${pathText(path)} must be ${expects}, got ${describeValue(e.data)}`;
  if (e.keyword === 'minLength' && e.data === '') {
    message = `${pathText(path)} is empty`;
  } else if (e.keyword === 'maxLength') {
    message = `${pathText(path)} is ${[...String(e.data)].length.toLocaleString('en')} characters long, more than the ${Number(e.params.limit).toLocaleString('en')} a brief can show`;
    hint = 'shorten it';
  } else if (e.keyword === 'uniqueItems') {
    const list = e.data as unknown[];
    message = `${pathText(path)} lists ${describeValue(list[Number(e.params.j)])} twice`;
    hint = 'list each value once';
  }
  if ((e.keyword === 'enum' || e.keyword === 'const') && typeof e.data === 'string') {
    const allowed = (e.keyword === 'enum' ? e.params.allowedValues : [e.params.allowedValue]) as unknown[];
    const near = closest(
      e.data,
      allowed.filter((v): v is string => typeof v === 'string'),
    );
    if (near) hint = `did you mean "${near}"?`;
  }
  return { code: 'job-bad-value', path, at: 'value', message, hint };
}

/** The nearest schema node at or above an error's keyword that says what it expects. */
function annotated(pointer: string): SchemaNode | undefined {
  const segs = pointer.split('/');
  for (let n = segs.length - 1; n >= 1; n--) {
    const node = nodeAtPointer(segs.slice(0, n).join('/'));
    if (node && !Array.isArray(node) && node['x-expects']) return node;
  }
  return undefined;
}

/** ajv's `/series/0/data` as a path, indices as numbers where the data holds a list. */
function instancePath(pointer: string, data: unknown): JobPath {
  const path: JobPath = [];
  let node = data;
  for (const raw of pointer.split('/').slice(1)) {
    const seg = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (Array.isArray(node)) {
      path.push(Number(seg));
      node = node[Number(seg)];
    } else {
      path.push(seg);
      node = node !== null && typeof node === 'object' ? (node as Record<string, unknown>)[seg] : undefined;
    }
  }
  return path;
}

/*
 * `anyOf` branches each start with a `type`. A branch whose type does not match the value is the wrong
 * reading of it, and its errors are noise; a branch of the right type is what the writer meant.
 */
interface BranchIndex {
  /** The `anyOf` errors by the instance path of their value. */
  anyOfs: Map<string, Located[]>;
  /** `instancePath|schema pointer` of every `type` error. */
  types: Set<string>;
}

function branchIndex(errors: Located[]): BranchIndex {
  const types = new Set<string>();
  for (const e of errors) if (e.keyword === 'type') types.add(`${e.instancePath}|${e.at}`);
  const anyOfs = new Map<string, Located[]>();
  for (const e of errors) {
    if (e.keyword !== 'anyOf') continue;
    const list = anyOfs.get(e.instancePath);
    if (list) list.push(e);
    else anyOfs.set(e.instancePath, [e]);
  }
  return { anyOfs, types };
}

function branchIsDead(anyOf: Located, branch: string, index: BranchIndex): boolean {
  return index.types.has(`${anyOf.instancePath}|${anyOf.at}/${branch}/type`);
}

function hasLiveBranch(anyOf: Located, index: BranchIndex): boolean {
  const branches = Array.isArray(anyOf.schema) ? anyOf.schema.length : 0;
  for (let k = 0; k < branches; k++) if (!branchIsDead(anyOf, String(k), index)) return true;
  return false;
}

/** Whether an error lies inside a dead branch of an `anyOf` at its value or at one of the values above it. */
function underDeadBranch(e: Located, index: BranchIndex): boolean {
  if (index.anyOfs.size === 0) return false;
  for (let path = e.instancePath; ; path = path.slice(0, path.lastIndexOf('/'))) {
    for (const a of index.anyOfs.get(path) ?? []) {
      if (a === e || !e.at.startsWith(`${a.at}/`)) continue;
      const branch = e.at.slice(a.at.length + 1).split('/')[0];
      if (branchIsDead(a, branch, index)) return true;
    }
    if (path === '') return false;
  }
}
