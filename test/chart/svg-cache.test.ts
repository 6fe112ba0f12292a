/**
 * renderSvg keeps compiled and parsed chart shapes between charts (src/chart/svg.ts). Checked against the
 * plain way of drawing a vega-lite spec, as vega documents it (compile, parse, a headless View, toSVG):
 * every chart, drawn after others of the same shape with other rows and other title texts (quotes,
 * backslashes, markup characters, a line separator), gives the same SVG byte for byte.
 */
import * as vega from 'vega';
import { compile, type TopLevelSpec } from 'vega-lite';
import { describe, expect, it } from 'vitest';
import { CHARTS } from '../../src/chart/index.js';
import { finishSvg, installFontMetrics, renderSvg, splitSpec } from '../../src/chart/svg.js';
import { sampleSeries } from './sample.js';

async function plainSvg(spec: TopLevelSpec, idPrefix: string): Promise<string> {
  installFontMetrics();
  const view = new vega.View(vega.parse(compile(spec).spec), { renderer: 'none' });
  try {
    vega.resetSVGDefIds();
    return finishSvg(await view.toSVG(), { idPrefix, title: 't', desc: 'd' });
  } finally {
    view.finalize();
  }
}

const SERIES = [
  sampleSeries(),
  sampleSeries({ unit: 'say "ML" \\ <b>&amp;</b>', spikes: [5, 30], provisionalCount: 0 }),
  sampleSeries({ unit: 'line\u2028separator', model: 'multiplicative', length: 60 }),
  sampleSeries({ unit: '', label: 'No unit', spikes: [] }),
  sampleSeries(),
];

/** The charts that have a vega-lite spec (a dense series' recent detail has none). */
const SPECS = CHARTS.flatMap((c) => (c.spec ? [{ ...c, spec: c.spec }] : []));

describe('renderSvg with kept shapes', () => {
  it('draws what the plain pipeline draws, for every chart of several series in a row', async () => {
    let charts = 0;
    for (const [k, series] of SERIES.entries()) {
      for (const definition of SPECS) {
        const spec = definition.spec(series, { locale: 'en-GB' });
        const idPrefix = `s${k}-${definition.id}`;
        const kept = await renderSvg(spec, { idPrefix, title: 't', desc: 'd' });
        expect(kept.svg, `${definition.id} of series ${k}`).toBe(await plainSvg(spec, idPrefix));
        charts++;
      }
    }
    expect(charts).toBe(SERIES.length * SPECS.length);
  });

  it('splits rows and title texts out of the spec, the same rows once', () => {
    const spec = CHARTS.find((c) => c.id === 'remainder')?.spec?.(sampleSeries({ spikes: [5] }), { locale: 'en-GB' });
    const shape = splitSpec(spec as TopLevelSpec);
    const text = JSON.stringify(shape.spec);
    expect(text).not.toContain('"values"');
    expect(text).not.toContain('"ML"');
    expect(shape.titles).toEqual(['ML']);
    // stems and points draw the very same rows: one data set
    const names = shape.data.map(([name]) => name);
    expect(new Set(names).size).toBe(names.length);
    expect(shape.data.length).toBeLessThan(text.split('"data":').length - 1);
  });
});
