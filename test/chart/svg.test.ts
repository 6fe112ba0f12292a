/**
 * The charts as documents: well-formed XML, labelled for screen readers, free of script, the same bytes for
 * the same data whatever the machine's time zone, and user text escaped. The checks follow the SVG 1.1
 * rules for <title>/<desc> (W3C SVG 1.1 2nd ed., §5.4) and WAI-ARIA 1.2 for role="img" with aria-labelledby.
 * The brief's SVG comes from the scene writer (scene-svg.ts); the specs' vega path (svg.ts) is checked at
 * the end: it compiles without warnings, and its finishing step keeps its guarantees.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { buildCharts, CHARTS, chartSpec } from '../../src/chart/index.js';
import { finishSvg, renderSvg } from '../../src/chart/svg.js';
import { LABEL_SIZE } from '../../src/chart/theme.js';
import type { Chart } from '../../src/vocabulary/brief.js';
import { sampleSeries } from './sample.js';
import { findAll, parseXml, textOf, type XmlElement } from './xml.js';

const NASTY = `<script>alert("x")</script> & 'quotes' "too" 😀`;

let charts: Chart[];

beforeAll(async () => {
  charts = await buildCharts(sampleSeries(), 'en-GB');
});

function firstChildren(root: XmlElement): XmlElement[] {
  return root.children.filter((c): c is XmlElement => typeof c === 'object').slice(0, 2);
}

describe('chart SVG documents', () => {
  it('come in reading order, six of them', () => {
    expect(charts.map((c) => c.id)).toEqual([
      'observed-trend',
      'adjusted-trend',
      'seasonal-profile',
      'remainder',
      'yoy',
      'comparisons',
    ]);
  });

  it('parse as XML with <title> and <desc> first and an image role labelled by both', () => {
    for (const chart of charts) {
      const root = parseXml(chart.svg);
      expect(root.name).toBe('svg');
      expect(root.attrs.role).toBe('img');
      const [title, desc] = firstChildren(root);
      expect(title.name).toBe('title');
      expect(desc.name).toBe('desc');
      expect(textOf(title)).toBe(chart.title);
      expect(textOf(desc)).toBe(chart.alt);
      expect(root.attrs['aria-labelledby']).toBe(`${title.attrs.id} ${desc.attrs.id}`);
      expect(Number(root.attrs.width)).toBe(chart.width);
      expect(Number(root.attrs.height)).toBe(chart.height);
    }
  });

  it('hold no script, no javascript: URL and no event handler', () => {
    for (const chart of charts) {
      expect(chart.svg).not.toMatch(/<script/i);
      expect(chart.svg).not.toMatch(/javascript:/i);
      const handlers = findAll(parseXml(chart.svg), (e) => Object.keys(e.attrs).some((a) => /^on/i.test(a)));
      expect(handlers).toEqual([]);
    }
  });

  it('fit an A4 text column: 640 px wide give or take the facet, about 220 px high', () => {
    for (const chart of charts) {
      expect(chart.width).toBeGreaterThan(600);
      expect(chart.width).toBeLessThanOrEqual(640);
      expect(chart.height).toBeGreaterThan(180);
      expect(chart.height).toBeLessThanOrEqual(240);
    }
  });

  it('print no type under 9 pt when 640 px are set 170 mm wide (1 pt = 25.4/72 mm)', () => {
    // 12 px × 170/640 mm = 3.19 mm = 9.04 pt.
    const pt = (px: number) => (px * 170) / 640 / (25.4 / 72);
    expect(pt(LABEL_SIZE)).toBeGreaterThanOrEqual(9);
    for (const chart of charts) {
      const sizes = [...chart.svg.matchAll(/font-size="([\d.]+)(px)?"/g)].map((m) => Number(m[1]));
      // Every text carries its size, in the SVG as in the scene.
      expect(sizes.length).toBe((chart.svg.match(/<text\b/g) ?? []).length);
      expect(sizes.length).toBeGreaterThan(0);
      for (const size of sizes) expect(pt(size)).toBeGreaterThanOrEqual(9);
    }
  });

  it('come with their scene, of the same size as the SVG', () => {
    for (const chart of charts) {
      expect(chart.scene?.width).toBe(chart.width);
      expect(chart.scene?.height).toBe(chart.height);
      expect(chart.scene?.marks.length).toBeGreaterThan(0);
    }
  });

  it('have specs that compile without a single vega-lite or vega warning', async () => {
    const series = sampleSeries();
    for (const definition of CHARTS) {
      const { warnings } = await renderSvg(chartSpec(definition.id, series, 'en-GB'), {
        idPrefix: 'w',
        title: 't',
        desc: 'd',
      });
      expect(warnings, definition.id).toEqual([]);
    }
  });

  it('cope with a series too short for a year-over-year change and with no comparisons', async () => {
    // Hourly data: a year back is 364 × 24 = 8736 periods, far more than the 48 here.
    const short = await buildCharts(sampleSeries({ frequency: 'hourly', comparisonLabels: [] }), 'en-GB');
    expect(short.map((c) => c.id)).not.toContain('comparisons');
    const yoy = short.find((c) => c.id === 'yoy')!;
    expect(yoy.alt).toContain('too short');
    parseXml(yoy.svg);
  });

  it('use ids unique across a page holding two series', async () => {
    const other = { ...sampleSeries(), id: 'power' };
    const all = [...charts, ...(await buildCharts(other, 'en-GB'))];
    const ids = all.flatMap((c) => findAll(parseXml(c.svg), (e) => 'id' in e.attrs).map((e) => e.attrs.id));
    expect(ids.length).toBeGreaterThan(0);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('give the same bytes on a second run', async () => {
    const again = await buildCharts(sampleSeries(), 'en-GB');
    expect(again.map((c) => c.svg)).toEqual(charts.map((c) => c.svg));
  });

  it('give the same bytes in another time zone (dates are read and drawn in UTC)', async () => {
    const saved = process.env.TZ;
    try {
      // Chatham Islands, UTC+12:45 in January: any local-time slip would move months and labels.
      process.env.TZ = 'Pacific/Chatham';
      expect(new Date(Date.UTC(2021, 0, 1)).getTimezoneOffset()).not.toBe(0);
      const there = await buildCharts(sampleSeries(), 'en-GB');
      expect(there.map((c) => c.svg)).toEqual(charts.map((c) => c.svg));
    } finally {
      if (saved === undefined) delete process.env.TZ;
      else process.env.TZ = saved;
    }
  });

  it('escape a label and unit holding markup, quotes, & and emoji', async () => {
    const unit = `<b a="1">ML</b> & 'x'`;
    const nasty = await buildCharts(sampleSeries({ label: NASTY, unit, comparisonLabels: [NASTY] }), 'en-GB');
    for (const chart of nasty) {
      expect(chart.svg).not.toMatch(/<script/i);
      expect(chart.svg).not.toMatch(/<b\b/);
      const root = parseXml(chart.svg);
      const [title] = firstChildren(root);
      expect(textOf(title)).toBe(chart.title);
      expect(chart.title.startsWith(NASTY)).toBe(true);
    }
    // The unit is the y-axis title; the comparison label is a panel header.
    const texts = (id: string) =>
      findAll(parseXml(nasty.find((c) => c.id === id)!.svg), (e) => e.name === 'text').map(textOf);
    expect(texts('observed-trend')).toContain(unit);
    expect(texts('comparisons')).toContain(NASTY);
  });

  it('cut a unit too long for the axis with "…", keeping what fits, markup shown as text', async () => {
    const long = `${NASTY} ${NASTY} ${NASTY}`;
    const [chart] = await buildCharts(sampleSeries({ unit: long }), 'en-GB');
    const title = findAll(parseXml(chart.svg), (e) => e.name === 'text' && /rotate/.test(e.attrs.transform ?? ''));
    expect(title).toHaveLength(1);
    const shown = textOf(title[0]);
    expect(shown.endsWith('…')).toBe(true);
    expect(long.startsWith(shown.slice(0, -1))).toBe(true);
    expect(shown.length).toBeGreaterThan(10);
  });

  it('set a unit or comparison label holding line breaks on one line, in the SVG as in the PDF', async () => {
    const broken = 'two\nlines\u2028here';
    const charts3 = await buildCharts(sampleSeries({ unit: broken, comparisonLabels: [broken] }), 'en-GB');
    for (const id of ['observed-trend', 'comparisons']) {
      const chart = charts3.find((c) => c.id === id)!;
      const texts = findAll(parseXml(chart.svg), (e) => e.name === 'text').map(textOf);
      expect(texts, id).toContain('two lines here');
      expect(
        texts.some((t) => /[\n\u2028]/.test(t)),
        id,
      ).toBe(false);
    }
  });

  it('write characters XML forbids (C0 controls, lone surrogates) as U+FFFD, still well-formed', async () => {
    const odd = 'a\u0001b\uD800c';
    const charts2 = await buildCharts(sampleSeries({ label: odd, unit: odd, comparisonLabels: [odd] }), 'en-GB');
    for (const chart of charts2) {
      const root = parseXml(chart.svg);
      expect(textOf(firstChildren(root)[0])).toContain('a\uFFFDb\uFFFDc');
    }
  });
});

describe('finishSvg', () => {
  const label = { idPrefix: 'x', title: 't', desc: 'd' };
  it('refuses output that carries script or a handler', () => {
    expect(() => finishSvg('<svg width="1" height="1"><script>1</script></svg>', label)).toThrow();
    expect(() => finishSvg('<svg width="1" height="1"><a href="javascript:1"/></svg>', label)).toThrow();
    expect(() => finishSvg('<svg width="1" height="1"><rect onclick="1"/></svg>', label)).toThrow();
  });

  it('renumbers ids in order of appearance and follows the references', () => {
    const raw =
      '<svg width="1" height="1"><defs><clipPath id="clip7"><rect/></clipPath><clipPath id="clip3"><rect/></clipPath></defs>' +
      '<g clip-path="url(#clip3)"/><g clip-path="url(#clip7)"/></svg>';
    const svg = finishSvg(raw, label);
    expect(svg).toContain('id="x-d1"');
    expect(svg).toContain('id="x-d2"');
    expect(svg).toContain('clip-path="url(#x-d2)"/><g clip-path="url(#x-d1)"');
    expect(svg).not.toContain('clip7');
  });

  it('leaves id-like text in labels alone', () => {
    const raw = '<svg width="1" height="1"><g id="clip1"/><text>see id="clip1"</text></svg>';
    expect(finishSvg(raw, label)).toContain('<text>see id="clip1"</text>');
  });
});
