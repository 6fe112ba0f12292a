/**
 * Text widths read from the Source Sans 3 TrueType file, checked against resvg, which shapes the same file
 * with its own font parser (an independent reading of the tables).
 */
import { readFileSync } from 'node:fs';
import { Resvg } from '@resvg/resvg-js';
import { describe, expect, it } from 'vitest';
import { advanceWidth, readFontMetrics } from '../../src/chart/font-metrics.js';
import { sourceSansFile, sourceSansFiles } from '../../src/chart/fonts.js';

const regular = readFontMetrics(readFileSync(sourceSansFile('Regular')));

function resvgInkWidth(text: string, size: number): number {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="2000" height="200"><text x="10" y="150" font-size="${size}" font-family="Source Sans 3">${text}</text></svg>`;
  const resvg = new Resvg(svg, { font: { fontFiles: sourceSansFiles(), loadSystemFonts: false } });
  const box = resvg.getBBox();
  if (!box) throw new Error('resvg drew nothing');
  return box.width;
}

describe('readFontMetrics', () => {
  it('reads the em size Adobe uses for its fonts (1000 units; from memory)', () => {
    expect(regular.unitsPerEm).toBe(1000);
  });

  it('agrees with resvg on the width of labels: a little wider, by under 4 %', () => {
    // resvg's ink box leaves out the first glyph's left and the last glyph's right side bearing, so the
    // advance sum is wider by those two bearings: about 2–3 % of these labels at 100 px.
    for (const text of ['Water delivered', 'trend (provisional)', 'Sept 2022', '1,234,567']) {
      const ours = advanceWidth(regular, text, 100);
      const theirs = resvgInkWidth(text, 100);
      expect(ours).toBeGreaterThan(theirs);
      expect((ours - theirs) / theirs).toBeLessThan(0.04);
    }
  });

  it('counts a missing character (emoji) as a full em and an empty text as nothing', () => {
    expect(advanceWidth(regular, '😀', 12)).toBe(12);
    expect(advanceWidth(regular, '', 12)).toBe(0);
  });
});
