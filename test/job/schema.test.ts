/**
 * The schema file itself: complete enough for editors (a description on every key, no unknown keys
 * anywhere), complete enough for our messages (what each key expects), its defaults the ones resolveJob
 * fills, and the Markdown reference generated from it.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { JOB_DEFAULTS } from '../../src/job/defaults.js';
import {
  allowedKeys,
  jobSchema,
  resolveRef,
  SCHEMA_PATH,
  type SchemaNode,
  schemaAt,
  schemaErrors,
  schemaKeyReference,
  schemaSections,
} from '../../src/job/schema.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/** Every `properties` entry outside the root's if/else (which only makes combine conditionally required). */
function everyProperty(): { path: string; node: SchemaNode }[] {
  const out: { path: string; node: SchemaNode }[] = [];
  const walk = (value: unknown, path: string): void => {
    if (value === null || typeof value !== 'object') return;
    const node = value as SchemaNode;
    for (const [key, child] of Object.entries(node.properties ?? {})) out.push({ path: `${path}.${key}`, node: child });
    for (const [key, child] of Object.entries(node)) {
      if (path === '' && (key === 'if' || key === 'else')) continue;
      walk(child, `${path}/${key}`);
    }
  };
  walk(jobSchema(), '');
  return out;
}

describe('schema/job.schema.json', () => {
  it('is read from the package root', () => {
    expect(SCHEMA_PATH).toBe(resolve(ROOT, 'schema/job.schema.json'));
    expect(jobSchema().$schema).toBe('https://json-schema.org/draft/2020-12/schema');
  });

  it('describes every key, for editors, and says what each expects, for our messages', () => {
    const props = everyProperty();
    expect(props.length).toBeGreaterThan(60);
    const undescribed = props.filter((p) => !p.node.description).map((p) => p.path);
    expect(undescribed).toEqual([]);
    // A key whose schema is a $ref may take the annotation from its target.
    const unexplained = props
      .filter((p) => !(p.node['x-expects'] ?? resolveRef(p.node)['x-expects']))
      .map((p) => p.path);
    expect(unexplained).toEqual([]);
  });

  it('allows no unknown keys in any mapping', () => {
    const open: string[] = [];
    const walk = (value: unknown, path: string): void => {
      if (value === null || typeof value !== 'object') return;
      const node = value as SchemaNode;
      if (node.type === 'object' && node.additionalProperties !== false) open.push(path);
      for (const [key, child] of Object.entries(node)) {
        if (path === '' && (key === 'if' || key === 'else')) continue;
        walk(child, `${path}/${key}`);
      }
    };
    walk(jobSchema(), '');
    expect(open).toEqual([]);
  });

  it('states the same defaults that resolveJob fills', () => {
    const d = (path: (string | number)[]) => schemaAt(path)?.default;
    expect(d(['brief', 'organisation'])).toBe(JOB_DEFAULTS.organisation);
    expect(d(['brief', 'author'])).toBe(JOB_DEFAULTS.author);
    expect(d(['brief', 'contact'])).toBe(JOB_DEFAULTS.contact);
    expect(d(['brief', 'locale'])).toBe(JOB_DEFAULTS.locale);
    expect(d(['brief', 'fiscal_year_start'])).toBe(JOB_DEFAULTS.fiscalYearStart);
    expect(d(['brief', 'outputs'])).toEqual(JOB_DEFAULTS.outputs);
    expect(d(['brief', 'page_size'])).toBe(JOB_DEFAULTS.pageSize);
    expect(d(['brief', 'pdf_engine'])).toBe(JOB_DEFAULTS.pdfEngine);
    expect(d(['brief', 'pdf_archival'])).toBe(JOB_DEFAULTS.pdfArchival);
    expect(d(['brief', 'accent'])).toBe(JOB_DEFAULTS.accent);
    expect(d(['series', 0, 'unit'])).toBe(JOB_DEFAULTS.unit);
    expect(d(['series', 0, 'good'])).toBe(JOB_DEFAULTS.good);
    expect(d(['series', 0, 'data', 'delimiter'])).toBe(JOB_DEFAULTS.delimiter);
    expect(d(['series', 0, 'decomposition', 'method'])).toBe(JOB_DEFAULTS.method);
    expect(d(['series', 0, 'decomposition', 'model'])).toBe(JOB_DEFAULTS.model);
    expect(d(['series', 0, 'decomposition', 'robust'])).toBe(JOB_DEFAULTS.robust);
    expect(d(['series', 0, 'firmness', 'periods'])).toBe(JOB_DEFAULTS.firmnessPeriods);
    expect(d(['series', 0, 'effects', 'days'])).toBe(JOB_DEFAULTS.days);
    expect(d(['series', 0, 'effects', 'leap_year'])).toBe(JOB_DEFAULTS.leapYear);
    expect(d(['series', 0, 'effects', 'find'])).toBe(JOB_DEFAULTS.find);
    expect(d(['series', 0, 'effects', 'events', 0, 'fading_rate'])).toBe(JOB_DEFAULTS.fadingRate);
    expect(d(['comparisons'])).toEqual(JOB_DEFAULTS.comparisons);
    expect(d(['record', 'store'])).toBe(JOB_DEFAULTS.recordStore);
    expect(d(['record', 'connection_env'])).toBe(JOB_DEFAULTS.recordConnectionEnv);
    expect(d(['record', 'required'])).toBe(JOB_DEFAULTS.recordRequired);
  });

  it('accepts the full example job and rejects one unknown key in it', () => {
    const full = parse(readFileSync(fileURLToPath(new URL('./files/full/job.yaml', import.meta.url)), 'utf8'));
    // Plain parsing reads `007` as the number 7, which the schema refuses; loadJob keeps the text as written.
    expect(schemaErrors(full).map((e) => e.instancePath)).toContain('/series/1/data/filter/equals/1');
    full.series[1].data.filter.equals[1] = '007';
    expect(schemaErrors(full)).toEqual([]);
    full.series[0].data.worksheet = 'Sheet1';
    const errors = schemaErrors(full);
    expect(errors.map((e) => [e.keyword, e.instancePath, e.params])).toEqual([
      ['additionalProperties', '/series/0/data', { additionalProperty: 'worksheet' }],
    ]);
  });

  it('lists the same decomposition keys in a series and in defaults (one definition)', () => {
    const inSeries = allowedKeys(schemaAt(['series', 0, 'decomposition'])!);
    const inDefaults = allowedKeys(schemaAt(['defaults', 'decomposition'])!);
    expect(inSeries).toEqual(inDefaults);
    expect(inSeries).toContain('seasonal_window');
    expect(inSeries).toContain('henderson');
  });
});

describe('schemaKeyReference', () => {
  const md = schemaKeyReference();

  it('has a table for every section of the file, each decomposition table once', () => {
    const headings = md.split('\n').filter((l) => l.startsWith('### '));
    expect(headings).toEqual([
      '### Top level',
      '### `brief`',
      '### `brief.email`',
      '### `series[]`',
      '### `series[].data`',
      '### `series[].data.filter`',
      '### `series[].decomposition`',
      '### `series[].effects`',
      '### `series[].effects.events[]`',
      '### `series[].firmness`',
      '### `comparisons[]`',
      '### `comparisons[].year_on_year`',
      '### `comparisons[].custom`',
      '### `defaults`',
      '### `record`',
    ]);
  });

  it('has a row for every key of every section', () => {
    for (const section of schemaSections()) {
      for (const key of section.keys) expect(md).toContain(`| \`${key}\` |`);
    }
  });

  it('shows type, default and description from the schema', () => {
    expect(md).toContain(
      '| `fiscal_year_start` | a whole month number 1–12 | `1` | Month the financial year begins (1 = January, 7 = July); used by fiscal_year_to_date. |',
    );
    expect(md).toContain('| `title` | text | required |');
    expect(md).toContain('| `outputs` | a list drawn from html, pdf, eml, json | `[html, pdf]` |');
    expect(md).toContain(
      '| `decomposition` | a mapping of decomposition settings; same keys as `series[].decomposition` | — |',
    );
  });
});
