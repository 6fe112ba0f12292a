/**
 * PNG output: the file signature and the IHDR size from the PNG specification (W3C, 2nd ed., §5.2 and
 * §11.2.2), and the text drawn in Source Sans 3 rather than a fallback face.
 */
import { describe, expect, it } from 'vitest';
import { buildCharts } from '../../src/chart/index.js';
import { chartPng, svgToPng } from '../../src/chart/png.js';
import { sampleSeries } from './sample.js';

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function ihdrSize(png: Buffer): { width: number; height: number } {
  // Signature (8 bytes), chunk length (4), "IHDR" (4), then width and height as big-endian 32-bit integers.
  expect(png.subarray(12, 16).toString('latin1')).toBe('IHDR');
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20) };
}

describe('chartPng', () => {
  it('is a PNG at twice the chart size', async () => {
    const charts = await buildCharts(sampleSeries(), 'en-GB');
    for (const chart of charts.slice(0, 2)) {
      const png = chartPng(chart);
      expect(png.subarray(0, 8).equals(SIGNATURE)).toBe(true);
      expect(ihdrSize(png)).toEqual({ width: 2 * chart.width, height: 2 * chart.height });
    }
  });

  it('draws text with the Source Sans 3 files, not whatever the system has', () => {
    // The same word in the named family and in a family nobody has: both fall to the loaded Source Sans 3
    // (defaultFontFamily), so the pictures agree; no system font is consulted.
    const svg = (family: string) =>
      `<svg xmlns="http://www.w3.org/2000/svg" width="120" height="30"><text x="4" y="22" font-size="20" font-family="${family}">Trend</text></svg>`;
    const named = svgToPng(svg("'Source Sans 3', sans-serif"));
    const unknown = svgToPng(svg('NoSuchFamily'));
    expect(named.equals(unknown)).toBe(true);
    // And the text is drawn at all: a blank picture would also be "equal".
    const blank = svgToPng('<svg xmlns="http://www.w3.org/2000/svg" width="120" height="30"></svg>');
    expect(named.equals(blank)).toBe(false);
  });
});
