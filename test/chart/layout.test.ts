/**
 * The charts' layout: labels thinned the way vega's parity strategy thins them, long texts cut with "…",
 * comparison spans on two lines when one does not fit, and — on every chart of a spread of series — no text
 * that leaves the figure or overprints another, measured with the font's own advance widths
 * (font-metrics.ts, checked against resvg in font-metrics.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { thinLabels } from '../../src/chart/axes.js';
import { fitText, textWidth } from '../../src/chart/font-metrics.js';
import { buildCharts, CHARTS } from '../../src/chart/index.js';
import { spanLines } from '../../src/chart/scenes/comparisons.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { baselineShift, findGroup, type Mark, type Scene, type TextMark } from '../../src/vocabulary/scene.js';
import { sampleSeries } from './sample.js';

interface Box {
  text: string;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** Every text's box in figure coordinates: its advance width, from 0.72 em above the baseline to 0.2 below. */
function textBoxes(scene: Scene): Box[] {
  const out: Box[] = [];
  const visit = (marks: readonly Mark[], ox: number, oy: number) => {
    for (const m of marks) {
      if (m.type === 'group') visit(m.marks, ox + m.x, oy + m.y);
      if (m.type !== 'text') continue;
      out.push(box(m, ox, oy));
    }
  };
  visit(scene.marks, 0, 0);
  return out;
}

function box(m: TextMark, ox: number, oy: number): Box {
  const w = textWidth(m.text, m.size, m.weight === 'bold');
  const lx0 = m.anchor === 'start' ? 0 : m.anchor === 'middle' ? -w / 2 : -w;
  const b = baselineShift(m.baseline, m.size);
  const [ly0, ly1] = [b - 0.72 * m.size, b + 0.2 * m.size];
  const [x, y] = [ox + m.x, oy + m.y];
  if (m.angle === -90) return { text: m.text, x0: x + ly0, x1: x + ly1, y0: y - (lx0 + w), y1: y - lx0 };
  return { text: m.text, x0: x + lx0, x1: x + lx0 + w, y0: y + ly0, y1: y + ly1 };
}

const SERIES: [string, SeriesBrief][] = [
  ['monthly', sampleSeries({ spikes: [0, 5, 20, 47] })],
  ['quarterly', sampleSeries({ frequency: 'quarterly', period: 4, length: 28, spikes: [27] })],
  ['weekly', sampleSeries({ frequency: 'weekly', period: 52, length: 260, spikes: [0, 100, 101, 259] })],
  ['daily', sampleSeries({ frequency: 'daily', period: 7, length: 400, spikes: [3, 399] })],
  ['hourly', sampleSeries({ frequency: 'hourly', period: 24, length: 600, comparisonLabels: [] })],
  [
    'long labels',
    sampleSeries({
      unit: 'thousand cubic metres of water delivered to customers each month',
      comparisonLabels: [
        'A comparison with a very long name indeed',
        'Year to date',
        'Fiscal year to date',
        'Last 12 months',
      ],
    }),
  ],
  ['large numbers', sampleSeries({ trend: Array.from({ length: 48 }, (_, i) => 2_000_000 + 40_000 * i) })],
  ['a comparison below zero', belowZero()],
];

/** A comparison whose current span is negative (a net figure): its bar hangs below the zero line. */
function belowZero(): SeriesBrief {
  const s = sampleSeries();
  s.analysis.comparisons[0].raw = { current: -500, baseline: 800, change: -1300, percent: -162.5 };
  return s;
}

describe('every chart’s text', () => {
  it.each(SERIES)('stays inside the figure and never overprints other text: %s', async (_, series) => {
    for (const chart of await buildCharts(series, 'en-GB')) {
      const boxes = textBoxes(chart.scene as Scene);
      expect(boxes.length).toBeGreaterThan(3);
      for (const b of boxes) {
        expect(b.x0, `${chart.id}: "${b.text}" left`).toBeGreaterThanOrEqual(0);
        expect(b.x1, `${chart.id}: "${b.text}" right`).toBeLessThanOrEqual(chart.width);
        expect(b.y0, `${chart.id}: "${b.text}" top`).toBeGreaterThanOrEqual(0);
        expect(b.y1, `${chart.id}: "${b.text}" bottom`).toBeLessThanOrEqual(chart.height);
      }
      for (let i = 0; i < boxes.length; i++)
        for (let j = i + 1; j < boxes.length; j++) {
          const [a, b] = [boxes[i], boxes[j]];
          const overlap =
            Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0) > 0.5 && Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0) > 0.5;
          expect(overlap, `${chart.id}: "${a.text}" and "${b.text}"`).toBe(false);
        }
    }
  });
});

describe('label thinning', () => {
  it('keeps all labels that clear each other by the separation', () => {
    expect(
      thinLabels(
        [
          [0, 10],
          [20, 30],
          [40, 50],
        ],
        8,
      ),
    ).toEqual([true, true, true]);
  });

  it('drops every other label, repeatedly, while any two collide (vega’s parity strategy)', () => {
    // Five labels 12 wide every 15 px: gaps of 3 < 8, so every other one goes; then gaps of 18 suffice.
    const five: [number, number][] = [0, 15, 30, 45, 60].map((x) => [x, x + 12]);
    expect(thinLabels(five, 8)).toEqual([true, false, true, false, true]);
    // Nine every 5 px: one round leaves gaps of −2, a second leaves 8, which is enough.
    const nine: [number, number][] = Array.from({ length: 9 }, (_, i): [number, number] => [5 * i, 5 * i + 12]);
    expect(thinLabels(nine, 8)).toEqual([true, false, false, false, true, false, false, false, true]);
  });
});

describe('fitting text', () => {
  it('leaves a text that fits alone and cuts one that does not, ending in "…"', () => {
    expect(fitText('Water', 12, 100)).toBe('Water');
    const cut = fitText('A comparison with a very long name indeed', 12, 100);
    expect(cut.endsWith('…')).toBe(true);
    expect(textWidth(cut, 12)).toBeLessThanOrEqual(100);
    // Whole characters only: an emoji (a surrogate pair) is never split.
    expect(fitText('😀😀😀😀😀😀😀😀😀😀', 12, 40)).toBe('😀😀…');
  });

  it('puts a span that does not fit under its bar on two lines, after the dash', () => {
    expect(spanLines('Sept 2026', 60)).toEqual(['Sept 2026']);
    expect(spanLines('Oct 24–Sept 25', 60)).toEqual(['Oct 24–', 'Sept 25']);
    expect(spanLines('2 Oct 25 – 30 Sept 26', 70)).toEqual(['2 Oct 25 –', '30 Sept 26']);
  });
});

describe('the year-over-year chart’s "provisional" label', () => {
  // Trend 100 + i: the change on a year earlier falls from 12 % (i = 12) to 4 % (i = 47), so the first bars
  // are the tallest and the provisional stretch at the end leaves the top of the band free.
  const rising = Array.from({ length: 48 }, (_, i) => 100 + i);
  const where = (series: SeriesBrief) => {
    const scene = CHARTS.find((c) => c.id === 'yoy')?.scene(series, { locale: 'en-GB' }) as Scene;
    const inBand = findGroup(scene.marks, 'provisional-band')?.marks.some((m) => m.type === 'text');
    const above = findGroup(scene.marks, 'provisional-label') !== undefined;
    return { inBand, above };
  };

  it('sits inside the band when no bar reaches its place', () => {
    expect(where(sampleSeries({ trend: rising, provisionalCount: 6 }))).toEqual({ inBand: true, above: false });
  });

  it('moves above the plot, over the band’s end, when the bars reach the top of the band', () => {
    // Every one of the 36 bars provisional, the first (tallest) under the label's place.
    expect(where(sampleSeries({ trend: rising, provisionalCount: 48 }))).toEqual({ inBand: false, above: true });
  });
});
