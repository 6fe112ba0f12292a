/**
 * Where a unit goes beside a number. Common practice, as Intl's currency format writes money (CLDR, as
 * shipped with Node 20's ICU): English puts the currency sign before the amount and the sign of a
 * negative amount before that ("-£1,522.00", checked in node); German and French after it ("1.522,00 £").
 * Any other unit follows the number ("1,522 ML"). A unit "£ thousand" once printed "1,522 £ thousand".
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { buildDocument } from '../../src/document/build.js';
import { briefView } from '../../src/document/view.js';
import { loadJob } from '../../src/job/load.js';
import { unitAround, withUnit } from '../../src/narrate/format.js';
import { verifyBrief } from '../../src/verify/index.js';
import type { Brief } from '../../src/vocabulary/brief.js';

describe('withUnit', () => {
  it('puts a currency sign where the locale writes money', () => {
    expect(withUnit('1,522', '£ thousand', 'en-GB')).toBe('£1,522 thousand');
    expect(withUnit('3.1', '$m', 'en-US')).toBe('$3.1m');
    expect(withUnit('40', '€', 'en-IE')).toBe('€40');
    expect(withUnit('1.522', '£ thousand', 'de-DE')).toBe('1.522 £ thousand');
    expect(withUnit('1 522', '€', 'fr-FR')).toBe('1 522 €');
  });
  it('keeps a sign before the currency sign', () => {
    expect(withUnit('\u221212', '£ thousand', 'en-GB')).toBe('\u2212£12 thousand');
    expect(withUnit('+4.5', '$m', 'en-US')).toBe('+$4.5m');
  });
  it('writes any other unit after the number, and nothing for none', () => {
    expect(withUnit('1,522', 'ML', 'en-GB')).toBe('1,522 ML');
    expect(withUnit('1,522', 'GBP thousand', 'en-GB')).toBe('1,522 GBP thousand');
    expect(withUnit('1,522', '', 'en-GB')).toBe('1,522');
    expect(unitAround('points', 'en-GB')).toEqual({ before: '', after: ' points' });
  });
});

describe('a brief in £ thousand', () => {
  const briefs: Record<string, Brief> = {};
  beforeAll(async () => {
    const dir = mkdtempSync(join(tmpdir(), 'trendbrief-units-'));
    // 72 months of a made-up level with a yearly swing; the numbers only need to reach four digits.
    const rows = ['month,value'];
    for (let i = 0; i < 72; i++) {
      const y = 2020 + Math.floor(i / 12);
      const m = String((i % 12) + 1).padStart(2, '0');
      rows.push(`${y}-${m},${(1400 + 2 * i + 80 * Math.sin((2 * Math.PI * i) / 12) + ((i * 37) % 11)).toFixed(1)}`);
    }
    writeFileSync(join(dir, 'spend.csv'), `${rows.join('\n')}\n`);
    for (const locale of ['en-GB', 'de-DE']) {
      const yaml = [
        'brief:',
        '  title: Spending',
        `  locale: ${locale}`,
        'series:',
        '  - id: spend',
        '    label: Spending',
        '    unit: £ thousand',
        '    combine: sum',
        '    good: neither',
        '    frequency: monthly',
        '    change_as: units',
        '    data: { file: spend.csv, date: month, value: value, decimal: "." }',
        'comparisons: [year_on_year, latest_year]',
      ].join('\n');
      const file = join(dir, `${locale}.yaml`);
      writeFileSync(file, `${yaml}\n`);
      const [u] = await buildBriefs(loadJob(file), { toolVersion: 'test', charts: false, epoch: 0 });
      if (u.error) throw u.error;
      briefs[locale] = u.brief as Brief;
    }
  });

  const texts = (brief: Brief): string[] => {
    const doc = JSON.stringify(buildDocument(brief, briefView(brief)));
    return [...brief.series.flatMap((s) => s.statements.map((x) => x.text)), doc];
  };

  it('says £1,522 thousand in English, never 1,522 £ thousand', () => {
    const all = texts(briefs['en-GB']).join('\n');
    expect(all).toMatch(/£\d[\d,]*(\.\d+)? thousand/);
    expect(all).not.toMatch(/\d £ thousand/);
    expect(verifyBrief(briefs['en-GB'])).toEqual([]);
  });

  it('keeps the sign after the number in German', () => {
    const all = texts(briefs['de-DE']).join('\n');
    expect(all).toMatch(/\d £ thousand/);
    expect(all).not.toMatch(/£\d/);
  });
});
