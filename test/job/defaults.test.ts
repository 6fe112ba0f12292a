/**
 * resolveJob on already-validated data: the naming of comparison kinds, label overrides, Henderson off,
 * and the decimal mark each locale writes.
 */
import { describe, expect, it } from 'vitest';
import { localeDecimal, resolveJob } from '../../src/job/defaults.js';
import type { RawJob } from '../../src/job/schema.js';

const series = { id: 'a', label: 'A', combine: 'sum' as const, data: { file: 'a.csv', date: 'd', value: 'v' } };

describe('localeDecimal', () => {
  it('gives the mark CLDR records for each locale (common practice)', () => {
    // English writes 1.5; German, French and Brazilian Portuguese write 1,5.
    expect(['en-GB', 'en-AU', 'en-US'].map(localeDecimal)).toEqual(['.', '.', '.']);
    expect(['de-DE', 'fr-FR', 'pt-BR'].map(localeDecimal)).toEqual([',', ',', ',']);
  });

  it('falls back to "." for a mark that is neither', () => {
    // Arabic as written in Egypt uses the Arabic decimal separator U+066B (CLDR, from memory).
    expect(new Intl.NumberFormat('ar-EG').formatToParts(1.5).find((p) => p.type === 'decimal')?.value).toBe('\u066b');
    expect(localeDecimal('ar-EG')).toBe('.');
  });
});

describe('resolveJob', () => {
  it('turns comparison names into kinds and keeps label overrides', () => {
    const raw: RawJob = {
      brief: { title: 'T' },
      series: [series],
      comparisons: [
        'fiscal_year_to_date',
        { latest_year: { label: 'Last twelve months' } },
        { custom: { label: 'Summer', current: ['2026-01', '2026-02'], baseline: ['2025-01', '2025-03'] } },
      ],
    };
    expect(resolveJob(raw, '/jobs/water/job.yaml', 'x').comparisons).toEqual([
      { kind: 'fiscal-year-to-date', label: null },
      { kind: 'latest-year', label: 'Last twelve months' },
      { kind: 'custom', label: 'Summer', current: ['2026-01', '2026-02'], baseline: ['2025-01', '2025-03'] },
    ]);
  });

  it('resolves paths from the job folder and keeps absolute ones', () => {
    const raw: RawJob = {
      brief: { title: 'T', logo: '../shared/logo.png', templates: '/srv/templates' },
      series: [{ ...series, data: { ...series.data, file: '/data/a.csv' } }],
    };
    const job = resolveJob(raw, '/jobs/water/job.yaml', 'x');
    expect([job.dir, job.brief.logo, job.brief.templates]).toEqual([
      '/jobs/water',
      '/jobs/shared/logo.png',
      '/srv/templates',
    ]);
    expect([job.series[0].data.file, job.series[0].data.fileAsWritten]).toEqual(['/data/a.csv', '/data/a.csv']);
  });

  it('reads henderson: false as no Henderson trend, and canonicalises the locale', () => {
    const raw: RawJob = {
      brief: { title: 'T', locale: 'en-au' },
      series: [{ ...series, decomposition: { method: 'classical', henderson: false } }],
    };
    const job = resolveJob(raw, '/j/job.yaml', 'x');
    expect(job.series[0].decomposition.henderson).toBeNull();
    // BCP 47 canonical case: language lower, region upper (RFC 5646 §2.1.1).
    expect(job.brief.locale).toBe('en-AU');
  });
});
