/**
 * Each comparison as a pair of bars, baseline then current, in its own panel scaled to the pair's larger
 * magnitude (comparisons.ts explains why), each bar labelled with its value and the current bar with the
 * change; the span under each bar names its periods, on two lines when one would not fit under the bar.
 */
import type { SeriesBrief } from '../../vocabulary/brief.js';
import { type Mark, oneLine, type Scene, type TextMark } from '../../vocabulary/scene.js';
import { bottomAxis } from '../axes.js';
import { BASELINE, CURRENT, panelTitles, relativeHeights, spanText } from '../comparisons.js';
import { fitText, textWidth } from '../font-metrics.js';
import { formatPercent, formatValue } from '../format.js';
import { PADDING } from '../frame.js';
import { LEGEND_HEIGHT, legend } from '../legend.js';
import type { ChartOptions } from '../options.js';
import { bandScale } from '../scale-band.js';
import { linearScale } from '../scale-linear.js';
import { CHART_WIDTH, LABEL_SIZE, PALETTE, TITLE_SIZE } from '../theme.js';

export const PANEL_HEIGHT = 140;
const SPACING = 16;
/**
 * Room over the tallest bar for its two label lines (the spec's 30 % headroom comes to about this), and under
 * the lowest when one is negative, where the labels go below the bar's end.
 */
const ROOM_ABOVE = 32;
const ROOM_BELOW = 36;
const HEADER_TOP = PADDING + LEGEND_HEIGHT + 8;
const PLOT_TOP = HEADER_TOP + TITLE_SIZE + 12;
const LINE = LABEL_SIZE + 2;
const VALUE_DY = 4;
const CHANGE_DY = 19;

/** A span label as one or two lines that fit `width` px: split after its dash, else at its last space. */
export function spanLines(text: string, width: number): string[] {
  if (textWidth(text, LABEL_SIZE) <= width) return [text];
  const dash = text.indexOf('–');
  const space = text.lastIndexOf(' ');
  const cut = dash > 0 ? dash + 1 : space > 0 ? space : -1;
  if (cut < 0) return [fitText(text, LABEL_SIZE, width)];
  return [text.slice(0, cut).trim(), text.slice(cut).trim()].map((l) => fitText(l, LABEL_SIZE, width));
}

function label(x: number, y: number, text: string, baseline: TextMark['baseline'], bold = false): TextMark {
  return {
    type: 'text',
    x,
    y,
    text,
    anchor: 'middle',
    baseline,
    size: LABEL_SIZE,
    weight: bold ? 'bold' : 'normal',
    fill: PALETTE.ink,
  };
}

export function comparisonsScene(series: SeriesBrief, options: ChartOptions): Scene {
  const { locale } = options;
  const comparisons = series.analysis.comparisons;
  const titles = panelTitles(comparisons);
  const n = Math.max(1, comparisons.length);
  const panelWidth = (CHART_WIDTH - 2 * PADDING - SPACING * (n - 1)) / n;
  const pairs = comparisons.map((c) => relativeHeights(c.raw.current, c.raw.baseline));
  const lowest = Math.min(0, ...pairs.flat().map((h) => h ?? 0));
  // Heights run from the lowest (or zero) to 1, the larger of each pair.
  const y = linearScale(lowest, 1, PANEL_HEIGHT - (lowest < 0 ? ROOM_BELOW : 0), ROOM_ABOVE);
  const zero = y(0);
  const band = bandScale(2, 0, panelWidth);

  const spans = comparisons.map((c) => [
    spanLines(spanText(c.baseline, series.frequency, locale), band.step - 4),
    spanLines(spanText(c.current, series.frequency, locale), band.step - 4),
  ]);
  const lines = Math.max(1, ...spans.flat().map((l) => l.length));

  const panels: Mark[] = comparisons.map((c, i) => {
    const [current, baseline] = pairs[i];
    const heights = [baseline, current];
    const texts = [formatValue(c.raw.baseline, locale), formatValue(c.raw.current, locale)];
    const marks: Mark[] = [];
    const bars: Mark[] = [];
    const values: Mark[] = [];
    heights.forEach((h, k) => {
      const x = band.centre(k);
      const top = h === null ? zero : y(h);
      if (h !== null)
        bars.push({
          type: 'rect',
          x: band.start(k),
          y: Math.min(top, zero),
          width: band.bandwidth,
          height: Math.abs(top - zero),
          fill: k === 0 ? PALETTE.baseline : PALETTE.current,
          stroke: { colour: PALETTE.current, width: 1.5 },
        });
      // Labels sit beyond the bar's end: above a rise from zero, under a bar below it.
      const down = h !== null && h < 0;
      values.push(label(x, top + (down ? VALUE_DY : -VALUE_DY), texts[k], down ? 'top' : 'bottom'));
      if (k === 1)
        values.push(
          label(
            x,
            top + (down ? CHANGE_DY : -CHANGE_DY),
            formatPercent(c.raw.percent, locale),
            down ? 'top' : 'bottom',
            true,
          ),
        );
    });
    marks.push({
      type: 'text',
      x: panelWidth / 2,
      y: HEADER_TOP - PLOT_TOP,
      text: fitText(oneLine(titles[i]), TITLE_SIZE, panelWidth),
      anchor: 'middle',
      baseline: 'top',
      size: TITLE_SIZE,
      weight: 'normal',
      fill: PALETTE.ink,
    });
    marks.push(
      bottomAxis(
        spans[i].map((l, k) => ({ x: band.centre(k), label: l[0], lines: l })),
        panelWidth,
        PANEL_HEIGHT,
        { flush: false, line: false, tickMarks: false, name: 'spans' },
      ),
    );
    marks.push({ type: 'group', name: 'comparison-bars', x: 0, y: 0, marks: bars });
    marks.push({ type: 'group', name: 'comparison-values', x: 0, y: 0, marks: values });
    marks.push({
      type: 'group',
      name: 'zero',
      x: 0,
      y: 0,
      marks: [
        { type: 'line', x1: 0, y1: zero, x2: panelWidth, y2: zero, stroke: { colour: PALETTE.ink, width: 1.25 } },
      ],
    });
    return { type: 'group', name: 'panel', x: PADDING + i * (panelWidth + SPACING), y: PLOT_TOP, marks };
  });

  const key = legend(
    [
      { label: BASELINE, shape: 'square', fill: PALETTE.baseline, stroke: { colour: PALETTE.current, width: 1.5 } },
      { label: CURRENT, shape: 'square', fill: PALETTE.current, stroke: { colour: PALETTE.current, width: 1.5 } },
    ],
    PADDING + 1,
    PADDING,
  ).group;
  const height = Math.ceil(PLOT_TOP + PANEL_HEIGHT + 2 + lines * LINE + PADDING);
  return { width: CHART_WIDTH, height, background: 'white', marks: [key, ...panels] };
}
