/**
 * The PDF brief's page geometry, type scale and colours. The colours and proportions follow the HTML
 * brief's stylesheet (templates/brief.css) so the two read as one design; sizes are in points.
 */

import { safeAccent } from '../../document/words.js';
import type { Face } from './fonts.js';

const MM = 72 / 25.4;

export interface Geometry {
  width: number;
  height: number;
  /** Distance from every paper edge inside which all marks stay. */
  margin: number;
  left: number;
  right: number;
  column: number;
  /** Top and bottom of the body text block; the running header and footer sit between these and the margin. */
  bodyTop: number;
  bodyBottom: number;
}

/** Paper sizes in points (ISO 216 A4 and US Letter). */
const PAPER = { A4: [595.28, 841.89], Letter: [612, 792] } as const;

export function geometry(pageSize: 'A4' | 'Letter'): Geometry {
  const [width, height] = PAPER[pageSize] ?? PAPER.A4;
  const margin = 18 * MM;
  return {
    width,
    height,
    margin,
    left: margin,
    right: width - margin,
    column: width - 2 * margin,
    bodyTop: margin + FURNITURE_BAND,
    bodyBottom: height - margin - FURNITURE_BAND,
  };
}

/** Height kept for the running header (and footer) between the margin and the body. */
export const FURNITURE_BAND = 24;

export interface TextStyle {
  face: Face;
  size: number;
  colour: string;
  /** Extra space between lines, added to the font's own line height (1.42 em for Source Sans 3). */
  lineGap: number;
}

export interface Theme {
  accent: string;
  ink: string;
  muted: string;
  rule: string;
  faint: string;
  cautionInk: string;
  cautionEdge: string;
  cautionGround: string;
  title: TextStyle;
  organisation: TextStyle;
  byline: TextStyle;
  h2: TextStyle;
  h3: TextStyle;
  h4: TextStyle;
  headline: TextStyle;
  body: TextStyle;
  small: TextStyle;
  figureLabel: TextStyle;
  figureValue: TextStyle;
  chartTitle: TextStyle;
  chartCaption: TextStyle;
  furniture: TextStyle;
  /** Table text sizes: the largest tried first, smaller ones when the columns do not fit. */
  tableSizes: number[];
  dataTableSizes: number[];
}

export function theme(accent: string): Theme {
  const ink = '#1f2328';
  const muted = '#5b6168';
  const a = safeAccent(accent);
  const style = (face: Face, size: number, colour: string, lineGap = 0): TextStyle => ({ face, size, colour, lineGap });
  return {
    accent: a,
    ink,
    muted,
    rule: '#d5d8dc',
    faint: '#eceef0',
    cautionInk: '#5e4a12',
    cautionEdge: '#c8b07a',
    cautionGround: '#fbf7ec',
    title: style('Semibold', 22, ink, -3),
    organisation: style('Regular', 9.5, muted),
    byline: style('Regular', 8.5, ink),
    h2: style('Semibold', 15, a, -2),
    h3: style('Semibold', 11, ink, -1),
    h4: style('Semibold', 9.5, muted),
    headline: style('Regular', 13, ink, -1),
    body: style('Regular', 9.5, ink, 0.5),
    small: style('Regular', 8, muted),
    figureLabel: style('Regular', 8, muted, -0.5),
    figureValue: style('Semibold', 15, ink, -2),
    chartTitle: style('Semibold', 9.5, ink),
    chartCaption: style('Regular', 8, muted, -0.3),
    furniture: style('Regular', 7.5, muted),
    tableSizes: [8.5, 8, 7.5, 7],
    dataTableSizes: [8, 7.5, 7],
  };
}
