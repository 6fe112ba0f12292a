/**
 * The brief as JSON (src/render/json.ts): the same value JSON.stringify gives (NaN as null, chart SVG and
 * scenes left out), written with each long list of numbers or dates on one line and put together as bytes.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import type { Brief } from '../../src/brief/model.js';
import { loadJob } from '../../src/job/load.js';
import { renderJson, renderJsonBytes } from '../../src/render/json.js';

async function waterBrief(): Promise<Brief> {
  const file = join(import.meta.dirname, '..', '..', 'examples', 'water-deliveries', 'job.yaml');
  const [unit] = await buildBriefs(loadJob(file), { toolVersion: 'test', charts: true });
  if (!unit.brief) throw unit.error;
  return unit.brief;
}

/** What JSON.stringify makes of the brief without charts' SVG and scenes: the reference value. */
function plainValue(brief: Brief): unknown {
  const plain = {
    ...brief,
    series: brief.series.map((s) => ({ ...s, charts: s.charts.map(({ svg: _svg, scene: _scene, ...rest }) => rest) })),
  };
  return JSON.parse(JSON.stringify(plain));
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
});
