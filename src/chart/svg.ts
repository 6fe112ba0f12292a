/**
 * A vega-lite spec to a static, labelled SVG string, rendered headless in Node (no canvas, no DOM). This is
 * the path of the public chart specs (chartSpec in src/index.ts), not of the brief: the brief's charts are
 * drawn from their scenes (scene-svg.ts), which needs no vega at all.
 * The output carries no script and no event handlers; it opens with <title> and <desc>, the root is
 * role="img" labelled by both. Ids vega writes (clip paths, gradients) come from process-wide counters, so
 * they are renumbered in order of appearance under the chart's own prefix: the same data gives the same bytes,
 * and several charts inlined in one HTML page cannot clash.
 *
 * Speed: compiling a vega-lite spec and parsing the vega spec cost about as much as drawing it, and a brief's
 * charts repeat a few shapes. So each spec is split into its shape (the spec with every inline `data.values`
 * replaced by a named data set, and every title text by a placeholder) and its content; the compiled spec
 * is kept per shape and the parsed dataflow per shape and titles, and each chart gets a new view of the kept
 * dataflow with its own rows inserted. vega-lite reads neither rows nor title text while compiling (it leaves
 * data to vega and passes titles through), so the SVG is the same byte for byte (test/chart/svg.test.ts).
 */
import * as vega from 'vega';
import { compile, type TopLevelSpec } from 'vega-lite';
import { advanceWidth, boldFontMetrics, regularFontMetrics } from './font-metrics.js';
import { escapeXml, idSafe } from './xml-text.js';

export { escapeXml, idSafe };

export interface SvgLabel {
  /** Prefix for every id inside the SVG; unique within a page (letters, digits, hyphens). */
  idPrefix: string;
  title: string;
  desc: string;
}

export interface RenderedSvg {
  svg: string;
  width: number;
  height: number;
  /** Warnings vega-lite or vega raised while compiling and rendering. */
  warnings: string[];
}

function collectingLogger(warnings: string[]) {
  let level = 2;
  const logger = {
    level(l?: number) {
      if (l === undefined) return level;
      level = l;
      return logger;
    },
    error(...args: unknown[]) {
      warnings.push(`error: ${args.map(String).join(' ')}`);
      return logger;
    },
    warn(...args: unknown[]) {
      warnings.push(args.map(String).join(' '));
      return logger;
    },
    info() {
      return logger;
    },
    debug() {
      return logger;
    },
  };
  return logger;
}

/** A spec without its content: rows as named data sets, title texts as placeholders. */
interface Shape {
  spec: TopLevelSpec;
  data: [string, unknown[]][];
  titles: string[];
}

const DATA_PREFIX = 'tb_rows_';
/** Title placeholders: private-use characters around the title's number (vega-lite may join two titles). */
const TITLE_OPEN = '\uE000';
const TITLE_CLOSE = '\uE001';
const TITLE_PLACEHOLDER = /\uE000(\d+)\uE001/g;

export function splitSpec(spec: TopLevelSpec): Shape {
  const data: [string, unknown[]][] = [];
  const names = new Map<unknown[], string>();
  const titles: string[] = [];
  const numbers = new Map<string, number>();
  const walk = (node: unknown, key: string): unknown => {
    // Equal texts share a placeholder, so vega-lite's merging of equal layer titles works as on the texts.
    if (typeof node === 'string' && key === 'title' && !node.includes(TITLE_OPEN)) {
      let k = numbers.get(node);
      if (k === undefined) {
        k = titles.length;
        numbers.set(node, k);
        titles.push(node);
      }
      return `${TITLE_OPEN}${k}${TITLE_CLOSE}`;
    }
    if (Array.isArray(node)) return node.map((x) => walk(x, ''));
    if (node === null || typeof node !== 'object') return node;
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(node)) {
      const values =
        k === 'data' && v !== null && typeof v === 'object' ? (v as { values?: unknown }).values : undefined;
      if (Array.isArray(values) && Object.keys(v as object).length === 1) {
        // Layers given the very same rows share one data set, as vega-lite merges equal inline data.
        let name = names.get(values);
        if (name === undefined) {
          name = `${DATA_PREFIX}${data.length}`;
          names.set(values, name);
          data.push([name, values]);
        }
        out[k] = { name };
      } else out[k] = walk(v, k);
    }
    return out;
  };
  return { spec: walk(spec, '') as TopLevelSpec, data, titles };
}

/** The compiled vega spec with each title placeholder replaced by its text. */
function fillTitles(node: unknown, titles: string[]): unknown {
  if (typeof node === 'string') {
    if (!node.includes(TITLE_OPEN)) return node;
    return node.replace(TITLE_PLACEHOLDER, (_, k: string) => {
      const text = titles[Number(k)];
      if (text === undefined) throw new Error(`chart title placeholder ${k} has no text`);
      return text;
    });
  }
  if (Array.isArray(node)) return node.map((x) => fillTitles(x, titles));
  if (node === null || typeof node !== 'object') return node;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(node)) out[k] = fillTitles(v, titles);
  return out;
}

interface Compiled {
  spec: vega.Spec;
  warnings: string[];
}

/** Kept shapes; a long-running process drawing endless new shapes starts afresh past this many. */
const CACHE_LIMIT = 64;
const compiledShapes = new Map<string, Compiled>();
const parsedShapes = new Map<string, vega.Runtime>();

function remember<V>(cache: Map<string, V>, key: string, make: () => V): V {
  let v = cache.get(key);
  if (v === undefined) {
    v = make();
    if (cache.size >= CACHE_LIMIT) cache.clear();
    cache.set(key, v);
  }
  return v;
}

export async function renderSvg(spec: TopLevelSpec, label: SvgLabel): Promise<RenderedSvg> {
  installFontMetrics();
  const shape = splitSpec(spec);
  const key = JSON.stringify(shape.spec);
  const compiled = remember(compiledShapes, key, () => {
    const warnings: string[] = [];
    // biome-ignore lint/suspicious/noExplicitAny: vega-lite's LoggerInterface and vega's differ only in typing.
    const vl = compile(shape.spec, { logger: collectingLogger(warnings) as any }).spec;
    return { spec: vl, warnings };
  });
  const runtime = remember(parsedShapes, `${key}\u0000${JSON.stringify(shape.titles)}`, () =>
    vega.parse(fillTitles(compiled.spec, shape.titles) as vega.Spec),
  );
  const warnings = [...compiled.warnings];
  // biome-ignore lint/suspicious/noExplicitAny: vega-lite's LoggerInterface and vega's differ only in typing.
  const logger = collectingLogger(warnings) as any;
  const view = new vega.View(runtime, { renderer: 'none', logger });
  try {
    for (const [name, values] of shape.data) view.data(name, values);
    vega.resetSVGDefIds();
    const raw = await view.toSVG();
    const svg = finishSvg(raw, label);
    const { width, height } = rootSize(svg);
    return { svg, width, height, warnings };
  } finally {
    view.finalize();
  }
}

/** Renumbers ids, adds title, desc and the ARIA attributes, and refuses anything that could run. */
export function finishSvg(raw: string, label: SvgLabel): string {
  const prefix = idSafe(label.idPrefix);
  const ids = new Map<string, string>();
  // Only inside tags: text content may hold ' id="…"' from a user's label (vega leaves quotes unescaped there,
  // but escapes "<" and ">", so a tag never starts or ends inside text).
  const TAG = /<[^<>]+>/g;
  // Speed: most tags carry no id and no reference; the cheap includes() checks skip them.
  for (const tag of raw.match(TAG) ?? []) {
    if (!tag.includes('id="')) continue;
    for (const m of tag.matchAll(/\sid="([^"]+)"/g)) {
      if (!ids.has(m[1])) ids.set(m[1], `${prefix}-d${ids.size + 1}`);
    }
  }
  let svg =
    ids.size === 0
      ? raw
      : raw.replace(TAG, (tag) =>
          !tag.includes('id="') && !tag.includes('url(#') && !tag.includes('href="#')
            ? tag
            : tag
                .replace(/(\sid=")([^"]+)(")/g, (_, a, id, b) => `${a}${ids.get(id) ?? id}${b}`)
                .replace(/url\(#([^)]+)\)/g, (whole, id) => (ids.has(id) ? `url(#${ids.get(id)})` : whole))
                .replace(/(href=")#([^"]+)(")/g, (whole, a, id, b) =>
                  ids.has(id) ? `${a}#${ids.get(id)}${b}` : whole,
                ),
        );

  const open = /^<svg\b[^>]*>/.exec(svg);
  if (!open) throw new Error('vega produced no <svg> root element');
  const titleId = `${prefix}-title`;
  const descId = `${prefix}-desc`;
  const root = open[0].replace(/^<svg\b/, `<svg role="img" aria-labelledby="${titleId} ${descId}"`);
  svg =
    root +
    `<title id="${titleId}">${escapeXml(label.title)}</title>` +
    `<desc id="${descId}">${escapeXml(label.desc)}</desc>` +
    svg.slice(open[0].length);

  // vega writes neither; a chart that did would be unsafe to inline into HTML or email.
  // Text content cannot hold a raw "<", so the attribute checks only ever look inside tags.
  if (unsafeSvg(svg)) {
    throw new Error('rendered chart contains script or an event handler');
  }
  return svg;
}

/**
 * Script, foreign content, an on… attribute or a javascript: link in any tag. Attribute values are left out
 * of the attribute-name check: vega writes them in double quotes with " escaped, and they may quote a user's
 * label such as "<img onerror=…>", which is inert there.
 */
function unsafeSvg(svg: string): boolean {
  if (/<script\b|<foreignObject\b/i.test(svg)) return true;
  for (const tag of svg.match(/<[^<>]+>/g) ?? []) {
    if (/\son[a-z]+\s*=/i.test(tag.replace(/"[^"]*"/g, '""'))) return true;
    if (/\shref\s*=\s*"\s*javascript:/i.test(tag)) return true;
  }
  return false;
}

function rootSize(svg: string): { width: number; height: number } {
  const open = /^<svg\b[^>]*>/.exec(svg)?.[0] ?? '';
  const width = Number(/\swidth="([\d.]+)"/.exec(open)?.[1]);
  const height = Number(/\sheight="([\d.]+)"/.exec(open)?.[1]);
  return { width, height };
}

let installed = false;

/**
 * Makes vega measure text with Source Sans 3 (regular, or bold for bold items). vega documents
 * `textMetrics.width` as the hook for this; it is process-wide, so installing it once is enough.
 */
export function installFontMetrics(): void {
  if (installed) return;
  const regular = regularFontMetrics();
  const bold = boldFontMetrics();
  // vega exports textMetrics at run time; its type declarations leave it out.
  const metrics = (vega as unknown as { textMetrics: { width: (item: TextItem, text: unknown) => number } })
    .textMetrics;
  metrics.width = (item, text) => {
    const size = item.fontSize != null ? Number(item.fontSize) || 0 : 11;
    const value = text == null ? '' : String(text).trim();
    if (size <= 0 || value === '') return 0;
    const weight = item.fontWeight;
    const isBold = weight === 'bold' || (typeof weight === 'number' && weight >= 600);
    const width = advanceWidth(isBold ? bold : regular, value, size);
    // vega truncates to item.limit through this same function; a clamped width says "too long" to it.
    const limit = Number(item.limit);
    return limit > 0 ? Math.min(width, limit) : width;
  };
  installed = true;
}

interface TextItem {
  fontSize?: number | string;
  fontWeight?: string | number;
  limit?: number;
}
