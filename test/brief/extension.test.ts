/**
 * Forecast extension in a whole brief: when the extension is skipped for a series the brief is still built
 * and its method appendix says why in one line; on monthly data it is on by default and the appendix names
 * the model. The series are invented here and checked by hand.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { seriesView } from '../../src/document/view.js';
import { loadJob } from '../../src/job/load.js';

const dir = mkdtempSync(join(tmpdir(), 'trendbrief-extension-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A one-series monthly job over `values` from January 2021. */
async function briefOf(name: string, values: number[]) {
  const rows = values.map((v, i) => `${2021 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')},${v}`);
  writeFileSync(join(dir, `${name}.csv`), `month,v\n${rows.join('\n')}\n`);
  const job = join(dir, `${name}.yaml`);
  writeFileSync(
    job,
    `brief:\n  title: ${name}\n  locale: en-GB\nseries:\n  - id: s\n    label: Meter\n    unit: kWh\n    combine: sum\n    data: { file: ${name}.csv, date: month, value: v }\n`,
  );
  const [unit] = await buildBriefs(loadJob(job), { toolVersion: 'test', charts: false, epoch: 0 });
  if (!unit.brief) throw unit.error;
  const s = unit.brief.series[0];
  const row = seriesView(s, 'en-GB').method.rows.find((r) => r[0] === 'Forecast extension');
  return { s, line: row?.[1] ?? '' };
}

describe('forecast extension in the brief', () => {
  test('a constant series: skipped, and the method appendix says why (no model fitted to rounding noise)', async () => {
    // Five years of 500 kWh. Its seasonally adjusted values differ from 500 only by rounding, which a model
    // search would once fit (an ARIMA(2,0,1) was reported); the series itself is constant.
    const { s, line } = await briefOf('flat', Array(60).fill(500));
    expect(s.extension).toEqual({ used: false, added: 0, model: null, skipped: 'the series is constant' });
    expect(line).toBe('skipped for this series: the series is constant');
  });

  test('a monthly series: on by default, the model and the periods added named', async () => {
    // 200 + 1.5t + 25 sin(2πt/12) with a repeating wobble: a steady rise and a yearly cycle.
    const values = Array.from(
      { length: 72 },
      (_, t) => 200 + 1.5 * t + 25 * Math.sin((2 * Math.PI * t) / 12) + [3, -2, 1, -4, 2, 0, -1][t % 7],
    );
    const { s, line } = await briefOf('rising', values);
    expect(s.extension.used).toBe(true);
    expect(s.extension.added).toBe(12);
    expect(line).toMatch(
      /^12 months of forecasts from ARIMA\(\d,\d,\d\).* on the seasonally adjusted series .*added before decomposing \(on by default for monthly data/,
    );
    expect(line).toMatch(
      /the firmness study extends each earlier cut by the same orders, their coefficients re-estimated/,
    );
  });
});
