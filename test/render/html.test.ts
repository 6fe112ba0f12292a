/**
 * The HTML brief: every example renders to one self-contained, valid, escaped file; template overrides
 * replace the built-in files by name; broken overrides fail with one located line.
 * External checks: html-validate (HTML Living Standard and WAI-ARIA rules), the HTML spec's character
 * references for escaping, and the examples' own Brief (each statement and figure must reach the page).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { HtmlValidate } from 'html-validate';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { briefView, dataTable } from '../../src/document/view.js';
import { FALLBACK_ACCENT } from '../../src/document/words.js';
import { loadJob } from '../../src/job/load.js';
import { renderHtml } from '../../src/render/html.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { errorOf } from '../support/error-of.js';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '../..');
const files = join(here, 'files');
const EXAMPLES = ['water-deliveries', 'online-orders', 'clinic-visits'];
/** The only addresses allowed in the page: the SVG and XLink namespace names, which are never fetched. */
const NAMESPACES = new Set(['http://www.w3.org/2000/svg', 'http://www.w3.org/1999/xlink']);

async function briefsOf(jobFile: string): Promise<Brief[]> {
  const units = await buildBriefs(loadJob(jobFile), { toolVersion: 'test', charts: true, epoch: 1767225600 });
  return units.map((u) => {
    if (u.error) throw u.error;
    return u.brief as Brief;
  });
}

/** Decodes the character references handlebars writes (HTML Living Standard §13.5): &amp; &lt; &gt; &quot; &#x27; &#x60; &#x3D;. */
function decode(html: string): string {
  return html.replace(
    /&(amp|lt|gt|quot|#x27|#x60|#x3D);/g,
    (_, e: string) => ({ amp: '&', lt: '<', gt: '>', quot: '"', '#x27': "'", '#x60': '`', '#x3D': '=' })[e] as string,
  );
}

/** Text outside the inline SVGs (those come from the chart stage and are checked there). */
function withoutSvg(html: string): string {
  return html.replace(/<svg[\s\S]*?<\/svg>/g, '');
}

/** The first match with a little context, or null: short enough to read when an expectation fails. */
function found(html: string, re: RegExp): string | null {
  const m = re.exec(html);
  return m ? html.slice(Math.max(0, m.index - 60), m.index + m[0].length + 60) : null;
}

/** `toContain` on a whole page would print the page; these print only what was looked for. */
function expectIn(html: string, part: string, note = ''): void {
  expect(html.includes(part), `${note} expected the page to contain ${JSON.stringify(part.slice(0, 200))}`).toBe(true);
}

function expectNotIn(html: string, part: string): void {
  expect(found(html, new RegExp(part.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'))), `unexpected ${part}`).toBeNull();
}

// The recommended preset, inline SVG included, with one rule off: long-title (at most 70 characters),
// because the page title is the job's own title and the brief does not cut the author's words.
const validator = new HtmlValidate({ extends: ['html-validate:recommended'], rules: { 'long-title': 'off' } });

async function validationErrors(html: string): Promise<string[]> {
  const report = await validator.validateString(html);
  return report.results.flatMap((r) => r.messages.map((m) => `${m.line}:${m.column} ${m.ruleId}: ${m.message}`));
}

const examples = new Map<string, Brief[]>();
let water: Brief;

beforeAll(async () => {
  for (const name of EXAMPLES) examples.set(name, await briefsOf(join(root, 'examples', name, 'job.yaml')));
  water = (examples.get('water-deliveries') as Brief[])[0];
}, 120_000);

describe.each(EXAMPLES)('the %s example', (name) => {
  it('renders every brief as one self-contained, escaped page that shows every statement', async () => {
    for (const brief of examples.get(name) as Brief[]) {
      const html = renderHtml(brief);
      const text = decode(html);
      expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
      // Nothing runs and nothing is fetched: no script, no link, no frames, no @import, no http(s) address
      // except the namespace names in xmlns attributes.
      expect(found(html, /<script/i)).toBeNull();
      expect(found(html, /<(link|iframe|object|embed|base)\b/i)).toBeNull();
      expect(found(html, /@import/i)).toBeNull();
      expect(found(html, /url\(\s*['"]?(?!data:)/i)).toBeNull();
      for (const m of html.matchAll(/https?:\/\/[^\s"'<>)]*/g)) expect(NAMESPACES.has(m[0]), m[0]).toBe(true);
      expect(html.match(/https?:\/\//g)?.length ?? 0).toBe(html.match(/xmlns(:xlink)?="https?:\/\//g)?.length ?? 0);
      for (const src of html.matchAll(/\ssrc="([^"]*)"/g)) expect(src[1].startsWith('data:')).toBe(true);

      for (const s of brief.series) {
        // The overview statement is the overview's row, shown only in a brief of several series (tested there).
        for (const st of s.statements) if (st.kind !== 'overview') expectIn(text, st.text, st.id);
        expectIn(html, `id="series-${s.id}"`);
      }
      for (const c of brief.cautions) expectIn(text, c.text);
      // The headline first: it is the first paragraph of the series section.
      const headline = brief.series[0].statements.find((x) => x.kind === 'headline')?.text as string;
      expect(decode(/<p class="headline">([^<]*)<\/p>/.exec(html)?.[1] ?? '')).toBe(headline);

      // Page size and accent come from the job.
      expectIn(html, `@page { size: ${brief.meta.pageSize === 'Letter' ? 'letter' : 'A4'}; }`);
      expectIn(html, `style="--accent: ${brief.meta.accentColour}"`);
      expectIn(html, `font-family:`);
      expectIn(html, `"Source Sans 3"`);
      // The PDF's font, embedded (subset to the page's characters: test/render/web-fonts.test.ts).
      expect(html.match(/@font-face\{[^}]*src:url\(data:font\/ttf;base64,/g)?.length).toBe(4);
    }
  });

  it('puts each chart inline in a figure with its caption, and the latest periods in the data appendix', () => {
    for (const brief of examples.get(name) as Brief[]) {
      const html = renderHtml(brief);
      for (const s of brief.series) {
        expect(s.charts.length).toBeGreaterThan(0);
        for (const c of s.charts) {
          const figure = new RegExp(
            `<figure class="chart" id="series-${s.id}-chart-${c.id}">\\s*<figcaption>([\\s\\S]*?)</figcaption>\\s*<svg`,
          ).exec(html);
          expect(figure, c.id).not.toBeNull();
          expectIn(decode(figure?.[1] ?? ''), c.caption);
          expectIn(html, c.svg);
        }
      }
      const tables = [...html.matchAll(/<table class="table-data">([\s\S]*?)<\/table>/g)];
      expect(tables.length).toBe(brief.series.length);
      brief.series.forEach((s, i) => {
        const body = tables[i][1].split('<tbody>')[1];
        const rows = body.match(/<tr>/g)?.length ?? 0;
        // The latest 400 periods at most (brief.data_periods' default), with a note saying so when cut.
        const n = s.components.dates.length;
        const first = Math.max(0, n - 400);
        expect(rows).toBe(n - first);
        if (first > 0) expectIn(decode(html), `The latest 400 of ${n.toLocaleString('en-GB')} periods are listed`);
        // Provisional periods are the last ones from provisionalFrom on, each marked with an asterisk.
        const marked = body.match(/<th scope="row">[^<]* \*<\/th>/g)?.length ?? 0;
        expect(marked).toBe(n - s.analysis.firmness.provisionalFrom);
        for (const row of dataTable(s, brief.meta.locale, first).rows.slice(0, 3))
          for (const cell of row) expectIn(decode(tables[i][1]), cell);
      });
    }
  });

  it('lists every method setting, its published source, the hashes, tool version and time in the method appendix', () => {
    for (const brief of examples.get(name) as Brief[]) {
      const html = renderHtml(brief);
      const appendix = decode(html.split('id="appendix-method"')[1].split('id="appendix-data"')[0]);
      const view = briefView(brief);
      for (const s of view.series) {
        for (const [setting, value] of s.method.rows) {
          expectIn(appendix, setting);
          expectIn(appendix, value);
        }
        for (const src of s.sources) expectIn(appendix, src.source);
      }
      for (const s of brief.series) expectIn(appendix, s.data.sha256);
      expectIn(appendix, brief.provenance.jobSha256);
      expectIn(appendix, 'trendbrief test');
      expectIn(appendix, `datetime="${brief.provenance.generatedAt}"`);
    }
  });

  it('passes html-validate with the recommended rules', async () => {
    // One brief per example keeps the run short; the clinic groups share one layout.
    const html = renderHtml((examples.get(name) as Brief[])[0]);
    expect(await validationErrors(html)).toEqual([]);
  });
});

describe('hostile text from the job', () => {
  let brief: Brief;
  let html: string;
  beforeAll(async () => {
    [brief] = await briefsOf(join(files, 'hostile', 'job.yaml'));
    html = renderHtml(brief);
  }, 60_000);

  it('comes out inert: no element is made from it, no script element anywhere', () => {
    expect(found(html, /<script/i)).toBeNull();
    expect(html.includes('&lt;script&gt;alert(1)&lt;/script&gt;')).toBe(true);
    // The organisation holds <b>, the unit <i>: neither may become an element.
    expect(found(html, /<b>|<i>/)).toBeNull();
    expectIn(html, 'Ünïcode &amp; Co &lt;b&gt;bold&lt;/b&gt;');
    expectIn(html, '&lt;i&gt;ML&lt;/i&gt;');
  });

  it('stays readable: quotes, ampersands, right-to-left text and emoji round-trip to the same characters', () => {
    const text = decode(withoutSvg(html));
    expectIn(text, `<title>${brief.meta.title} — ${brief.meta.organisation}</title>`);
    expectIn(text, `<h1>${brief.meta.title}</h1>`);
    const label = brief.series[0].label;
    expect(label).toContain('מים 💧');
    expectIn(text, `<bdi>${label}</bdi>`);
    // Non-ASCII is written as itself, not as character references, so the source reads as the job did.
    expectIn(html, 'מים 💧');
    expectIn(html, 'מחלקת ניתוח 📈');
    // Inside attributes the quotes are escaped, so the attribute cannot be closed early.
    expectIn(html, 'alt="Ünïcode &amp; Co &lt;b&gt;bold&lt;/b&gt; logo"');
    expectIn(html, '&quot;flow&quot; &#x27;north&#x27;');
  });

  it('gives each series its own section, with a contents list, and embeds the logo as a data URI', async () => {
    expect(brief.series.length).toBe(2);
    expect(html.match(/<section class="series" /g)?.length).toBe(2);
    expect(html.match(/<table class="table-data">/g)?.length).toBe(2);
    expectIn(html, '<a href="#series-water">');
    expectIn(html, '<a href="#series-orders">');
    expect(found(html, /<img class="logo" src="data:image\/svg\+xml;base64,[A-Za-z0-9+/]+(&#x3D;)*"/)).not.toBeNull();
    expect(await validationErrors(html)).toEqual([]);
  });

  it('never writes an accent colour that is not #rrggbb into the style attribute', () => {
    // The job refuses such a colour; a Brief built another way must still not break out of the attribute.
    const bad = { ...brief, meta: { ...brief.meta, accentColour: 'red;background:url(https://attacker.invalid/x)' } };
    const out = renderHtml(bad);
    expectIn(out, `style="--accent: ${FALLBACK_ACCENT}"`);
    expectNotIn(out, 'attacker.invalid');
  });
});

describe('template overrides', () => {
  const dir = (name: string) => join(files, 'templates', name);

  it('replace a partial by name and keep every other built-in file', () => {
    const html = renderHtml(water, { templatesDir: dir('partial-only') });
    const headline = water.series[0].statements[0].text;
    expectIn(decode(html), `<p class="headline headline-override">In short: ${headline}</p>`);
    expectNotIn(html, '<p class="headline">');
    expectIn(html, '<dl class="key-figures">');
    expectIn(html, '.key-figure .value');
  });

  it('replace the stylesheet by name', () => {
    const html = renderHtml(water, { templatesDir: dir('css-only') });
    expectIn(html, '.marker-css-override {');
    expectNotIn(html, '.key-figure .value');
    expectIn(html, '<dl class="key-figures">');
  });

  it('replace the main template, which may call a new partial of its own and the built-in ones', async () => {
    const html = renderHtml(water, { templatesDir: dir('main-and-new-partial') });
    expectIn(html, '<section class="short-series" id="series-north-deliveries">');
    expectIn(html, '<p class="headline">');
    expectNotIn(html, 'id="appendix-data"');
    expectIn(html, '.key-figure .value');
    expect(await validationErrors(html)).toEqual([]);
  });

  it('come from the job’s brief.templates folder', async () => {
    const job = loadJob(join(files, 'with-templates', 'job.yaml'));
    expect(job.brief.templates).toBe(dir('partial-only'));
    const [brief] = await briefsOf(job.file);
    expectIn(renderHtml(brief, { templatesDir: job.brief.templates }), 'headline-override');
  });

  it('report a missing partial in one line naming the template file, the partial and a fix', () => {
    const e = errorOf(() => renderHtml(water, { templatesDir: dir('missing-partial') }));
    expect(e.code).toBe('template-partial');
    // Line 6, column 1 of brief.hbs is `{{> sumary}}`.
    expect(e.oneLine()).toMatch(
      /missing-partial\/brief\.hbs:6:1: the partial "sumary" is not found — add partials\/sumary\.hbs/,
    );
    expect(e.oneLine()).toContain('key-figures');
    expect(e.oneLine()).not.toContain('\n');
  });

  it('report a template syntax error with its file and line', () => {
    const e = errorOf(() => renderHtml(water, { templatesDir: dir('bad-syntax') }));
    expect(e.code).toBe('template-syntax');
    // `{{label</dt>` on line 3 never closes its tag.
    expect(e.oneLine()).toMatch(/bad-syntax\/partials\/key-figures\.hbs:3: template syntax error near ".*\{\{label/);
    expect(e.oneLine()).not.toContain('\n');
  });

  it('report a block closed by the wrong name with the line and column where it opens', () => {
    const e = errorOf(() => renderHtml(water, { templatesDir: dir('bad-block') }));
    expect(e.code).toBe('template-syntax');
    // `{{#if unusual}}` opens on line 3 (its name "if" at column 6) and `{{/each}}` closes it.
    expect(e.oneLine()).toMatch(
      /bad-block\/partials\/unusual\.hbs:3:6: template syntax error: the block \{\{#if\}\} is closed by \{\{\/each\}\}/,
    );
  });

  it('report an unknown helper with its file, line and column and the helpers there are', () => {
    const e = errorOf(() => renderHtml(water, { templatesDir: dir('unknown-helper') }));
    expect(e.code).toBe('template-helper');
    // `<p class="headline">` is 20 characters, so `{{shout …}}` starts at column 21 of line 2.
    expect(e.oneLine()).toMatch(
      /unknown-helper\/partials\/headline\.hbs:2:21: unknown helper "shout" — the helpers available are .*ofKind/,
    );
    expect(e.oneLine()).not.toContain('\n');
  });

  it('refuse a stylesheet that would fetch a file, and a folder that does not exist', () => {
    const css = errorOf(() => renderHtml(water, { templatesDir: dir('css-import') }));
    expect(css.code).toBe('template-css');
    expect(css.oneLine()).toMatch(/css-import\/brief\.css:2:1: the stylesheet uses @import/);
    const missing = errorOf(() => renderHtml(water, { templatesDir: dir('no-such-folder') }));
    expect(missing.code).toBe('templates-missing');
  });

  it('leave the built-in brief as it is when the folder holds none of its files', () => {
    const empty = mkdtempSync(join(tmpdir(), 'trendbrief-templates-'));
    try {
      expect(renderHtml(water, { templatesDir: empty }) === renderHtml(water)).toBe(true);
    } finally {
      rmSync(empty, { recursive: true, force: true });
    }
  });
});
