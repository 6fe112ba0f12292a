/**
 * The brief as JSON (src/render/json.ts): the same value JSON.stringify gives (NaN as null, chart SVG and
 * scenes left out), written with each long list of numbers or dates on one line and put together as bytes.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { renderJson, renderJsonBytes, renderJsonPieces } from '../../src/render/json.js';
import type { Brief } from '../../src/vocabulary/brief.js';

async function waterBrief(): Promise<Brief> {
  const file = join(import.meta.dirname, '..', '..', 'examples', 'water-deliveries', 'job.yaml');
  const [unit] = await buildBriefs(loadJob(file), { toolVersion: 'test', charts: true });
  if (!unit.brief) throw unit.error;
  return unit.brief;
}

/**
 * What JSON.stringify makes of the brief without charts' SVG and scenes, and without the periods' ordinals
 * (periodIndex, and `ordinals` beside a span's labels), which the JSON gives as the labels: the reference value.
 */
function plainValue(brief: Brief): unknown {
  const plain = {
    ...brief,
    series: brief.series.map(({ periodIndex: _index, ...s }) => ({
      ...s,
      charts: s.charts.map(({ svg: _svg, scene: _scene, ...rest }) => rest),
    })),
  };
  return JSON.parse(JSON.stringify(plain, (key, value) => (key === 'ordinals' ? undefined : value)));
}

describe('renderJson', () => {
  it('reads back as the value JSON.stringify writes, NaN as null', async () => {
    const brief = await waterBrief();
    const text = renderJson(brief);
    expect(JSON.parse(text)).toEqual(plainValue(brief));
    expect(text).not.toContain('<svg');
    expect(text.endsWith('}\n')).toBe(true);
  });

  it('writes each component on one line', async () => {
    const brief = await waterBrief();
    const lines = renderJsonBytes(brief).toString('utf8').split('\n');
    const n = brief.series[0].components.dates.length;
    for (const key of ['dates', 'observed', 'trend', 'remainder']) {
      const line = lines.find((l) => l.trimStart().startsWith(`"${key}": [`)) ?? '';
      expect(JSON.parse(line.trim().replace(`"${key}": `, '').replace(/,$/, '')).length, key).toBe(n);
    }
  });

  it('falls back to plain JSON when a text of the brief looks like its placeholder', async () => {
    const brief = await waterBrief();
    const odd: Brief = { ...brief, meta: { ...brief.meta, title: '\u0000list0\u0000' } };
    expect(JSON.parse(renderJson(odd))).toEqual(plainValue(odd));
  });

  it('makes a long list piece by piece as the pieces are taken, each small, the whole the same JSON', async () => {
    const brief = await waterBrief();
    // 30,000 periods: several pieces per list, with NaN, ±∞, -0 and non-ASCII dates at the pieces' seams.
    const n = 30_000;
    const values = Array.from({ length: n }, (_, i) => Math.sin(i) * 1e3 + i / 7);
    for (const i of [0, 4095, 4096, 8191, 8192, n - 1]) values[i] = [Number.NaN, -0, Number.POSITIVE_INFINITY][i % 3];
    const dates = Array.from({ length: n }, (_, i) => (i % 5000 === 4096 % 5000 ? `période ${i}` : `p${i}`));
    const s0 = brief.series[0];
    const long: Brief = {
      ...brief,
      series: [{ ...s0, components: { ...s0.components, dates, observed: values, trend: values.map((v) => v / 3) } }],
    };
    const pieces = renderJsonPieces(long);
    // Lazy: the first piece is there before the lists are encoded (an array of every piece was the old way).
    expect(Array.isArray(pieces)).toBe(false);
    const all = [...pieces];
    expect(Math.max(...all.map((p) => p.length))).toBeLessThan(256 * 1024);
    expect(all.length).toBeGreaterThan(3 * Math.ceil(n / 4096));
    const text = Buffer.concat(all).toString('utf8');
    expect(JSON.parse(text)).toEqual(plainValue(long));
  });
});
