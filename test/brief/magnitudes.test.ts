/**
 * Series of any magnitude make a brief whose every number is readable. Found: values of about 1e-20
 * passed `check` but rendering failed with Intl's "minimumFractionDigits value is out of range" (a chart
 * tick of step 5e-21 asked for 21 decimals), and small changes printed as "0.00".
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { dataTable } from '../../src/document/view.js';
import { loadJob } from '../../src/job/load.js';
import { renderHtml } from '../../src/render/html.js';

const dir = mkdtempSync(join(tmpdir(), 'trendbrief-magnitudes-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Four years of a monthly level with a season, scaled by `scale` (invented, hand-made). */
function job(name: string, scale: number): string {
  const rows = ['month,value'];
  for (let i = 0; i < 48; i++) {
    const v = (1 + 0.01 * i + 0.2 * Math.sin((i * Math.PI) / 6) + 0.03 * Math.cos(i * 1.7)) * scale;
    rows.push(`${2020 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')},${v}`);
  }
  writeFileSync(join(dir, `${name}.csv`), `${rows.join('\n')}\n`);
  const file = join(dir, `${name}.yaml`);
  writeFileSync(
    file,
    `brief: { title: ${name} }\nseries:\n  - { id: ${name}, label: Level, combine: mean, data: { file: ${name}.csv, date: month, value: value } }\n`,
  );
  return file;
}

describe.each([
  ['tiny', 1e-20],
  ['small', 1e-3],
  ['large', 1e12], // the data readers refuse values above 1e15,
])('a %s series (scale %d)', (name, scale) => {
  test('builds, charts and renders; no figure prints as zero when it is not', async () => {
    const units = await buildBriefs(loadJob(job(name, scale)), { toolVersion: 'test', charts: true, epoch: 0 });
    const brief = units[0].brief;
    expect(units[0].error).toBeNull();
    if (!brief) throw new Error('no brief');
    const html = renderHtml(brief);
    expect(html).toContain('<html');
    for (const st of brief.series[0].statements) {
      for (const f of st.figures) {
        if (typeof f.value === 'number' && f.value !== 0 && Number.isFinite(f.value))
          expect(f.formatted, `${st.id}.${f.name} = ${f.value}`).toMatch(/[1-9]/);
      }
    }
  });

  test('the data appendix shows each observed value as read, so it can be matched to the file', async () => {
    // Found: the appendix rounded observed values to about three figures.
    const file = job(name, scale);
    const units = await buildBriefs(loadJob(file), { toolVersion: 'test', charts: false, epoch: 0 });
    const s = units[0].brief?.series[0];
    if (!s) throw new Error('no brief');
    const csv = readFileSync(file.replace(/yaml$/, 'csv'), 'utf8').trim().split('\n').slice(1);
    const rows = dataTable(s, 'en-GB').rows;
    expect(rows).toHaveLength(csv.length);
    rows.forEach((row, i) => {
      const read = Number(row[1].replaceAll(',', '').replace('E', 'e').replaceAll('\u2212', '-'));
      expect(read).toBe(Number(csv[i].split(',')[1]));
    });
  });
});
