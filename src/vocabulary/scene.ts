/**
 * The scene: everything a chart is, as plain marks in CSS px on a canvas of `width` × `height`, origin top
 * left, y downwards. The chart builders (scenes/) write it; scene-svg.ts turns it into SVG and the PDF
 * renderer draws it with pdfkit, so both show the same marks without either re-reading the other's output.
 * Plain data only (no classes, no functions): a scene crosses worker threads by structured clone.
 */

export type LineCap = 'butt' | 'round' | 'square';
export type LineJoin = 'miter' | 'round' | 'bevel';

export interface Stroke {
  colour: string;
  width: number;
  /** One dash and one gap, px; absent for a solid line. */
  dash?: readonly [number, number];
  cap?: LineCap;
  join?: LineJoin;
  /** 0–1; absent for opaque. */
  opacity?: number;
}

export interface RectMark {
  type: 'rect';
  x: number;
  y: number;
  width: number;
  height: number;
  /** null for an outline only. */
  fill: string | null;
  fillOpacity?: number;
  stroke?: Stroke;
}

/** A straight line from (x1, y1) to (x2, y2): axis domains, ticks, gridlines, zero lines, stems. */
export interface LineMark {
  type: 'line';
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  stroke: Stroke;
}

/**
 * One or more polylines drawn with one stroke: each segment is a flat list of points [x0, y0, x1, y1, …].
 * A line broken by missing values is one mark with several segments.
 */
export interface PathMark {
  type: 'path';
  segments: number[][];
  stroke: Stroke;
}

/**
 * Filled polygons without an outline (a band between a low and a high line): each segment is a flat list of
 * points [x0, y0, x1, y1, …], closed back to its first point.
 */
export interface AreaMark {
  type: 'area';
  segments: number[][];
  fill: string;
  /** 0–1; absent for opaque. */
  fillOpacity?: number;
}

export type SymbolShape = 'circle' | 'diamond' | 'square' | 'stroke';

/**
 * A point marker centred on (x, y). `size` is vega's symbol size in px²: a square of side √size, a circle
 * of diameter √size, a diamond √size from corner to corner, and for 'stroke' (line legends) a horizontal
 * line √size long. symbolRadius gives half of √size.
 */
export interface SymbolMark {
  type: 'symbol';
  shape: SymbolShape;
  x: number;
  y: number;
  size: number;
  fill: string | null;
  stroke?: Stroke;
}

export type Anchor = 'start' | 'middle' | 'end';
export type Baseline = 'alphabetic' | 'top' | 'middle' | 'bottom';

/** One line of text at (x, y): anchor is horizontal, baseline vertical, both before the rotation `angle`. */
export interface TextMark {
  type: 'text';
  x: number;
  y: number;
  text: string;
  anchor: Anchor;
  baseline: Baseline;
  size: number;
  weight: 'normal' | 'bold';
  fill: string;
  /** Degrees clockwise about (x, y), as SVG's rotate(); −90 reads bottom to top. */
  angle?: number;
}

/** Marks moved by (x, y), optionally clipped to the rectangle (0, 0, clip.width, clip.height) of its own frame. */
export interface GroupMark {
  type: 'group';
  /** What the group holds ("trend", "yoy", "y-axis"); written as the SVG group's class. */
  name: string;
  x: number;
  y: number;
  clip?: { width: number; height: number };
  marks: Mark[];
}

export type Mark = RectMark | LineMark | PathMark | AreaMark | SymbolMark | TextMark | GroupMark;

export interface Scene {
  width: number;
  height: number;
  background: string;
  marks: Mark[];
}

/**
 * From a baseline to the alphabetic baseline, px down, for text of a size: "top" puts about the top of
 * accented capitals at y, "middle" the middle of the capitals, "bottom" about the descenders' bottom. The
 * fractions are the ones vega's text marks use (0.79, 0.30 and −0.21 of the size), so labels sit where they
 * sat in the vega-drawn charts; for Source Sans 3 (OpenType OS/2: capitals 660, descender −326 of 1000
 * units) they land within a pixel of those edges at 12 px.
 */
export function baselineShift(baseline: Baseline, size: number): number {
  switch (baseline) {
    case 'top':
      return 0.79 * size;
    case 'middle':
      return 0.3 * size;
    case 'bottom':
      return -0.21 * size;
    default:
      return 0;
  }
}

/** Half the extent of a symbol of a size: the circle's radius, the square's and diamond's half width. */
export function symbolRadius(size: number): number {
  return Math.sqrt(Math.max(0, size)) / 2;
}

/** The group of a name anywhere in the scene (the first, depth first), or undefined. */
export function findGroup(marks: readonly Mark[], name: string): GroupMark | undefined {
  for (const m of marks) {
    if (m.type !== 'group') continue;
    if (m.name === name) return m;
    const inner = findGroup(m.marks, name);
    if (inner) return inner;
  }
  return undefined;
}

/** Text as one line: runs of white space (newlines, tabs, line separators) become one space. */
export function oneLine(text: string): string {
  return text.replace(/\s+/g, ' ');
}
