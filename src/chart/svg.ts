/**
 * A vega-lite spec to a static, labelled SVG string, rendered headless in Node (no canvas, no DOM). This is
 * the path of the public chart specs (chartSpec in src/index.ts, generated from the brief's scenes), not of
 * the brief: the brief's charts are drawn from their scenes (scene-svg.ts), which needs no vega at all.
 * The output carries no script and no event handlers; it opens with <title> and <desc>, the root is
 * role="img" labelled by both. Ids vega writes (clip paths, gradients) come from process-wide counters, so
 * they are renumbered in order of appearance under the chart's own prefix: the same data gives the same bytes,
 * and several charts inlined in one HTML page cannot clash.
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

export async function renderSvg(spec: TopLevelSpec, label: SvgLabel): Promise<RenderedSvg> {
  installFontMetrics();
  const warnings: string[] = [];
  // biome-ignore lint/suspicious/noExplicitAny: vega-lite's LoggerInterface and vega's differ only in typing.
  const logger = collectingLogger(warnings) as any;
  const compiled = compile(spec, { logger }).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: 'none', logger });
  try {
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
