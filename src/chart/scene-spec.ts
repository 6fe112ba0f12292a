/**
 * A chart's vega-lite spec, generated from the scene the brief draws, so the public spec and the brief's
 * chart cannot drift apart: the scene builders (scenes/) are the one place that decides what a chart
 * shows, and this writes their marks for vega as scene-svg.ts writes them as SVG.
 *
 * Every mark keeps its place in CSS px (each position channel has `scale: null`), its colours, strokes,
 * dashes and text. Runs of marks of one kind and one style within one group of the scene become one layer,
 * in drawing order, described by the group's name ("plot/trend", "legend"), so a reader can restyle a
 * layer or drop it. Polylines are line marks (a `segment` field keeps breaks at missing values apart),
 * filled bands are geoshapes under the identity projection, markers are point marks, axis lines, ticks and
 * stems are rules. The numbers behind the marks are in the brief's JSON; the spec holds what is drawn.
 *
 *   sceneSpec({ width: 10, height: 10, background: 'white', marks: [{ type: 'line', x1: 0, y1: 5, x2: 10,
 *   y2: 5, stroke: { colour: '#000', width: 1 } }] }) → one 'rule' layer with the row {x: 0, y: 5, x2: 10, y2: 5}
 */
import type { TopLevelSpec } from 'vega-lite';
import { baselineShift, type Mark, type Scene, type Stroke } from '../vocabulary/scene.js';
import { FONT_FAMILY } from './theme.js';

type Row = Record<string, unknown>;

interface Layer {
  /** Which group of the scene the marks come from, and their kind and style: marks alike share a layer. */
  key: string;
  description: string;
  mark: Record<string, unknown>;
  encoding: Record<string, unknown>;
  projection?: Record<string, unknown>;
  rows: Row[];
}

const px = (field: string) => ({ field, type: 'quantitative', scale: null });
const XY = { x: px('x'), y: px('y') };
const XY2 = { ...XY, x2: { field: 'x2' }, y2: { field: 'y2' } };
const ALIGN = { start: 'left', middle: 'center', end: 'right' } as const;

function strokeProps(s: Stroke | undefined): Record<string, unknown> {
  if (!s) return { stroke: null };
  return {
    stroke: s.colour,
    strokeWidth: s.width,
    strokeCap: s.cap ?? 'butt',
    strokeJoin: s.join ?? 'miter',
    ...(s.dash ? { strokeDash: [s.dash[0], s.dash[1]] } : {}),
    ...(s.opacity !== undefined && s.opacity < 1 ? { strokeOpacity: s.opacity } : {}),
  };
}

function fillProps(fill: string | null, opacity?: number): Record<string, unknown> {
  if (fill === null) return { fill: null };
  return { fill, ...(opacity !== undefined && opacity < 1 ? { fillOpacity: opacity } : {}) };
}

/** The layer a mark goes into (its style) and the rows it adds; null for a mark that draws nothing. */
function place(
  m: Exclude<Mark, { type: 'group' }>,
  dx: number,
  dy: number,
  n: number,
): Omit<Layer, 'description'> | null {
  switch (m.type) {
    case 'rect': {
      if (!(m.width > 0 && m.height > 0)) return null;
      const mark = { type: 'rect', ...fillProps(m.fill, m.fillOpacity), ...strokeProps(m.stroke) };
      const row = { x: dx + m.x, y: dy + m.y, x2: dx + m.x + m.width, y2: dy + m.y + m.height };
      return { key: JSON.stringify(mark), mark, encoding: XY2, rows: [row] };
    }
    case 'line': {
      const mark = { type: 'rule', ...strokeProps(m.stroke) };
      const row = { x: dx + m.x1, y: dy + m.y1, x2: dx + m.x2, y2: dy + m.y2 };
      return { key: JSON.stringify(mark), mark, encoding: XY2, rows: [row] };
    }
    case 'path': {
      const mark = { type: 'line', interpolate: 'linear', ...strokeProps(m.stroke) };
      const rows: Row[] = [];
      m.segments.forEach((seg, k) => {
        if (seg.length < 4) return;
        for (let i = 0; i + 1 < seg.length; i += 2) {
          rows.push({ x: dx + seg[i], y: dy + seg[i + 1], segment: `${n}.${k}`, order: i / 2 });
        }
      });
      if (rows.length === 0) return null;
      const encoding = { ...XY, detail: { field: 'segment', type: 'nominal' }, order: { field: 'order' } };
      return { key: JSON.stringify(mark), mark, encoding, rows };
    }
    case 'area': {
      const mark = { type: 'geoshape', ...fillProps(m.fill, m.fillOpacity), stroke: null };
      const rows: Row[] = [];
      for (const seg of m.segments) {
        if (seg.length < 6) continue;
        const ring: number[][] = [];
        for (let i = 0; i + 1 < seg.length; i += 2) ring.push([dx + seg[i], dy + seg[i + 1]]);
        ring.push(ring[0]);
        rows.push({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } });
      }
      if (rows.length === 0) return null;
      // Identity at scale 1 with no translation: the polygon's coordinates are px, as in the scene.
      const projection = { type: 'identity', scale: 1, translate: [0, 0] };
      return { key: JSON.stringify(mark), mark, encoding: {}, projection, rows };
    }
    case 'symbol': {
      const mark = {
        type: 'point',
        shape: m.shape,
        size: m.size,
        opacity: 1,
        filled: m.fill !== null,
        ...fillProps(m.fill),
        ...strokeProps(m.stroke),
      };
      return { key: JSON.stringify(mark), mark, encoding: XY, rows: [{ x: dx + m.x, y: dy + m.y }] };
    }
    case 'text': {
      if (m.text === '') return null;
      // vega rounds a baseline's offset to whole px (0.79 × 12 px draws 9 px below the top); the scene
      // does not, so dy gives back the fraction.
      const shift = baselineShift(m.baseline, m.size);
      const fraction = Math.round((shift - Math.round(shift)) * 1000) / 1000;
      const mark = {
        type: 'text',
        align: ALIGN[m.anchor],
        baseline: m.baseline,
        font: FONT_FAMILY,
        fontSize: m.size,
        fontWeight: m.weight,
        fill: m.fill,
        ...(fraction !== 0 ? { dy: fraction } : {}),
        // vega-lite takes angles from 0 to 360, clockwise like SVG's rotate().
        ...(m.angle ? { angle: ((m.angle % 360) + 360) % 360 } : {}),
      };
      const encoding = { ...XY, text: { field: 'text' } };
      return { key: JSON.stringify(mark), mark, encoding, rows: [{ x: dx + m.x, y: dy + m.y, text: m.text }] };
    }
  }
}

/** The scene's marks as layers, in drawing order; consecutive marks alike in one group share a layer. */
function layersOf(
  marks: readonly Mark[],
  dx: number,
  dy: number,
  path: string,
  out: Layer[],
  count = { marks: 0 },
): void {
  for (const m of marks) {
    if (m.type === 'group') {
      // No vega-lite layer clips to an inner rectangle; no chart clips today, and none may without a spec.
      if (m.clip) throw new Error(`chart group "${m.name}" is clipped: the spec cannot say so`);
      layersOf(m.marks, dx + m.x, dy + m.y, path === '' ? m.name : `${path}/${m.name}`, out, count);
      continue;
    }
    const placed = place(m, dx, dy, count.marks++);
    if (placed === null) continue;
    const description = path === '' ? m.type : path;
    const last = out[out.length - 1];
    if (last && last.key === placed.key && last.description === description) last.rows.push(...placed.rows);
    else out.push({ ...placed, description });
  }
}

/** The vega-lite spec that draws the scene: the same marks, at the same places, in the same order. */
export function sceneSpec(scene: Scene, description?: string): TopLevelSpec {
  const layers: Layer[] = [];
  layersOf(scene.marks, 0, 0, '', layers);
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...(description ? { description } : {}),
    width: scene.width,
    height: scene.height,
    autosize: { type: 'none' },
    padding: 0,
    background: scene.background,
    config: { view: { stroke: null }, aria: false, mark: { tooltip: false }, font: FONT_FAMILY },
    layer: layers.map((l) => ({
      description: l.description,
      data: { values: l.rows },
      mark: l.mark,
      ...(l.projection ? { projection: l.projection } : {}),
      encoding: l.encoding,
    })),
  } as unknown as TopLevelSpec;
}
