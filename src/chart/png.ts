/**
 * A chart's SVG as a PNG at twice its size, for email clients that do not show inline SVG. resvg is given the
 * Source Sans 3 TrueType files and no system fonts, so the picture is the same on every machine.
 */
import { Resvg } from '@resvg/resvg-js';
import type { Chart } from '../vocabulary/brief.js';
import { FONT_NAME, sourceSansFiles } from './fonts.js';

export const PNG_SCALE = 2;

export function svgToPng(svg: string, scale = PNG_SCALE): Buffer {
  const resvg = new Resvg(svg, {
    fitTo: { mode: 'zoom', value: scale },
    background: 'white',
    font: { fontFiles: sourceSansFiles(), loadSystemFonts: false, defaultFontFamily: FONT_NAME },
  });
  return resvg.render().asPng();
}

/**
 * The chart as a PNG at twice its size, for email. Kept out of chart/index.ts so HTML and PDF briefs never load
 * resvg's native module.
 */
export function chartPng(chart: Chart): Buffer {
  return svgToPng(chart.svg);
}
