/**
 * Dense series (src/chart/dense.ts, dense-charts.ts): calendar summaries instead of a solid block of lines,
 * the recent detail, and captions true of the marks drawn. Worked examples small enough to check by hand.
 */
import { describe, expect, it } from 'vitest';
import { bucketise, denseUnit, sliceMeans } from '../../src/chart/dense.js';
import { textWidth } from '../../src/chart/font-metrics.js';
import { buildCharts, CHARTS } from '../../src/chart/index.js';
import { findGroup, type Mark, type Scene } from '../../src/vocabulary/scene.js';
import { sampleSeries } from './sample.js';

const DAY = 86_400_000;
const at = (iso: string) => Date.parse(iso);

function all(marks: readonly Mark[]): Mark[] {
  return marks.flatMap((m) => (m.type === 'group' ? all(m.marks) : [m]));
}

describe('bucketise', () => {
  it('gives each ISO week its mean, lowest and highest value (hand-checked)', () => {
    // Monday 1 January 2024 to Wednesday 10 January: values 1…10. Week one holds 1…7: mean 4, range 1–7.
    // Week two holds 8, 9, 10: its range stays, its mean (3 of the fullest's 7 values) is left out.
    const times = Array.from({ length: 10 }, (_, i) => at('2024-01-01') + i * DAY);
    const values = times.map((_, i) => i + 1);
    const b = bucketise(times, values, 'week');
    expect(Array.from(b.count)).toEqual([7, 3]);
    expect(Array.from(b.mean)).toEqual([4, Number.NaN]);
    expect(Array.from(b.min)).toEqual([1, 8]);
    expect(Array.from(b.max)).toEqual([7, 10]);
    expect(b.start[0]).toBe(at('2024-01-01'));
    expect(b.end[0]).toBe(at('2024-01-08'));
    expect(b.end[1]).toBe(at('2024-01-10'));
  });

  it('skips missing values and leaves a bucket of none undefined', () => {
    const times = Array.from({ length: 3 }, (_, i) => Date.UTC(2024, i, 15));
    const b = bucketise(times, [2, Number.NaN, 6], 'month');
    expect(Array.from(b.count)).toEqual([1, 0, 1]);
    expect(Array.from(b.mean)).toEqual([2, Number.NaN, 6]);
  });

  it('walks months across year ends and quarters from January', () => {
    const times = [Date.UTC(2023, 10, 30), Date.UTC(2023, 11, 31), Date.UTC(2024, 0, 1), Date.UTC(2024, 3, 1)];
    expect(Array.from(bucketise(times, [1, 2, 3, 4], 'month').count)).toEqual([1, 1, 1, 0, 0, 1]);
    expect(Array.from(bucketise(times, [1, 2, 3, 4], 'quarter').count)).toEqual([2, 1, 1]);
  });
});

describe('denseUnit', () => {
  it('draws monthly data and short daily data period by period', () => {
    const monthly = Array.from({ length: 600 }, (_, i) => Date.UTC(1970, i, 1));
    expect(denseUnit('monthly', monthly)).toBeNull();
    const daily = Array.from({ length: 400 }, (_, i) => at('2024-01-01') + i * DAY);
    expect(denseUnit('daily', daily)).toBeNull();
  });

  it('takes the finest unit leaving at most 260 summaries', () => {
    // 1,734 days (about 248 weeks) → weeks; 2,000 days (286 weeks) → months; a century of hours → years.
    const days = (n: number) => Array.from({ length: n }, (_, i) => at('2022-01-01') + i * DAY);
    expect(denseUnit('daily', days(1734))).toBe('week');
    expect(denseUnit('daily', days(2000))).toBe('month');
    const hours = Array.from({ length: 2 }, (_, i) => at('1900-01-01') + i * 137 * 365 * DAY);
    expect(denseUnit('hourly', [...hours.slice(0, 1), ...Array(500).fill(hours[0]), hours[1]])).toBe('year');
  });
});

describe('sliceMeans', () => {
  it('averages runs of equal length at their mean instant (hand-checked)', () => {
    // Six values in three runs of two: means 1.5, 3.5, 5.5 at instants 0.5, 2.5, 4.5.
    expect(sliceMeans([0, 1, 2, 3, 4, 5], [1, 2, 3, 4, 5, 6], 3)).toEqual({ t: [0.5, 2.5, 4.5], v: [1.5, 3.5, 5.5] });
  });
});

const dailyLong = () =>
  sampleSeries({ frequency: 'daily', period: 7, length: 1500, start: '2021-01-04', spikes: [100, 700, 1400] });

describe('charts of a dense series', () => {
  it('draw the observed values as a band and a line of summaries, not one vertex a period', async () => {
    const s = dailyLong();
    const charts = await buildCharts(s, 'en-GB');
    const observed = charts.find((c) => c.id === 'observed-trend')?.scene as Scene;
    const context = findGroup(observed.marks, 'context');
    const areas = all(context?.marks ?? []).filter((m) => m.type === 'area');
    expect(areas.length).toBe(1);
    const vertices = all(observed.marks).reduce(
      (k, m) => k + (m.type === 'path' || m.type === 'area' ? m.segments.reduce((a, seg) => a + seg.length / 2, 0) : 0),
      0,
    );
    // 1,500 days are about 215 weeks: band (2 × 215) + mean line (215) + trend (~420) — far under 3,000.
    expect(vertices).toBeLessThan(1500);
    expect(charts.find((c) => c.id === 'observed-trend')?.caption).toMatch(
      /lowest to the highest of the daily values in each week/,
    );
  });

  it('add the recent detail, day by day, after the observed chart', async () => {
    const charts = await buildCharts(dailyLong(), 'en-GB');
    expect(charts.map((c) => c.id).slice(0, 3)).toEqual(['observed-trend', 'recent', 'adjusted-trend']);
    const recent = charts[1];
    expect(recent.title).toBe('Water delivered: the last 13 weeks, day by day');
    const line = findGroup((recent.scene as Scene).marks, 'context')?.marks[0];
    expect(line?.type === 'path' && line.segments[0].length / 2).toBe(91);
  });

  it('draw no recent detail for a series shown period by period', async () => {
    const charts = await buildCharts(sampleSeries(), 'en-GB');
    expect(charts.some((c) => c.id === 'recent')).toBe(false);
  });
});

describe('the remainder chart’s caption', () => {
  /** Diamonds in the plot and labels over or under them. */
  function counts(scene: Scene) {
    const plot = findGroup(scene.marks, 'plot');
    const diamonds = all(plot?.marks ?? []).filter((m) => m.type === 'symbol' && m.shape === 'diamond').length;
    const labels =
      (findGroup(scene.marks, 'labels-above')?.marks.length ?? 0) +
      (findGroup(scene.marks, 'labels-below')?.marks.length ?? 0);
    return { diamonds, labels };
  }
  const remainder = CHARTS.find((c) => c.id === 'remainder');

  it('says every unusual value is labelled only when every diamond has its label', () => {
    const s = sampleSeries({ spikes: [5, 20, 40] });
    const scene = remainder?.scene(s, { locale: 'en-GB' }) as Scene;
    expect(counts(scene)).toEqual({ diamonds: 3, labels: 3 });
    expect(remainder?.caption(s, scene)).toMatch(/diamonds mark unusual values, labelled with their period\.$/);
  });

  it('says how many carry a label when some diamonds have none (crowded neighbours, more than ten)', () => {
    // Fourteen spikes on neighbouring months: labels would overprint, so fewer than fourteen are kept.
    const spikes = Array.from({ length: 14 }, (_, i) => 10 + i);
    const s = sampleSeries({ spikes });
    const scene = remainder?.scene(s, { locale: 'en-GB' }) as Scene;
    const { diamonds, labels } = counts(scene);
    expect(diamonds).toBe(14);
    expect(labels).toBeLessThan(14);
    expect(remainder?.caption(s, scene)).toContain(`${labels} of the 14`);
    expect(remainder?.caption(s, scene)).not.toMatch(/unusual values, labelled with their period/);
  });

  it('keeps labels moved in from the plot’s ends from overprinting each other', () => {
    // Spikes on the last day and 40 days before it (about 78 px apart on this plot): far enough apart where
    // they fall, but the last day's label is moved in from the right edge, onto its neighbour's place.
    const s = sampleSeries({ frequency: 'daily', period: 7, length: 300, start: '2024-01-01', spikes: [299, 259] });
    const scene = remainder?.scene(s, { locale: 'en-GB' }) as Scene;
    const labels = (findGroup(scene.marks, 'labels-above')?.marks ?? []).flatMap((m) => (m.type === 'text' ? [m] : []));
    const boxes = labels.map((m) => [m.x - textWidth(m.text, m.size) / 2, m.x + textWidth(m.text, m.size) / 2]);
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++)
        expect(boxes[i][1] <= boxes[j][0] || boxes[j][1] <= boxes[i][0], `${labels[i].text} / ${labels[j].text}`).toBe(
          true,
        );
    expect(remainder?.caption(s, scene)).toContain(labels.length === 2 ? 'labelled with their period' : '1 of the 2');
  });
});
