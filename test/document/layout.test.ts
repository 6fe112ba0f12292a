/**
 * The document (src/document/) as every format shows it: the job's brief.sections, series_sections and
 * data_periods hold in the HTML, the PDF and both parts of the email alike, and the overview of a brief of
 * two series shows each series' overview statement, whose claims the verifier checks.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { simpleParser } from 'mailparser';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { chartPng } from '../../src/chart/png.js';
import { buildDocument } from '../../src/document/build.js';
import { briefView } from '../../src/document/view.js';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import { emailImages, renderEmail } from '../../src/render/email.js';
import { renderHtml } from '../../src/render/html.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import { verifyBrief } from '../../src/verify/index.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import type { LayoutSpec } from '../../src/vocabulary/settings.js';
import { pdfText } from '../render/files-pdf/poppler.js';

const JOB = fileURLToPath(new URL('./files/two-series/job.yaml', import.meta.url));
const hasPoppler = spawnSync('pdftotext', ['-v']).error === undefined;
const dir = mkdtempSync(join(tmpdir(), 'tb-document-'));

let brief: Brief;

beforeAll(async () => {
  const [unit] = await buildBriefs(loadJob(JOB), { toolVersion: 'test', charts: true, epoch: 1_767_225_600 });
  brief = unit.brief as Brief;
}, 120_000);

function withLayout(layout: Partial<LayoutSpec>): Brief {
  return { ...brief, meta: { ...brief.meta, layout: { ...brief.meta.layout, ...layout } } };
}

/** The brief in every format, as text a reader sees: HTML source, PDF text, email HTML and text parts. */
async function formats(b: Brief): Promise<{ html: string; pdf: string; emailHtml: string; emailText: string }> {
  const document = buildDocument(b, briefView(b));
  const pdfBytes = await renderPdf(b, { document });
  const file = join(dir, `${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, pdfBytes);
  const eml = await renderEmail(b, {
    pdf: pdfBytes,
    pdfName: 'two.pdf',
    pngs: emailImages(b, chartPng, document),
    email: { subject: null, from: null, to: [], cc: [] },
    document,
  });
  const mail = await simpleParser(eml, { keepCidLinks: true });
  return {
    html: renderHtml(b, { document }),
    pdf: hasPoppler ? pdfText(file).replace(/\s+/g, ' ') : '',
    emailHtml: mail.html || '',
    emailText: (mail.text ?? '').replace(/\s+/g, ' '),
  };
}

describe('the job’s sections', () => {
  it('by default: masthead, overview, contents, each series, cautions, the two appendices', () => {
    const doc = buildDocument(brief, briefView(brief));
    expect(doc.sections.map((s) => s.name)).toEqual([
      'masthead',
      'overview',
      'contents',
      'series',
      'series',
      'cautions',
      'appendix appendix-method',
      'appendix appendix-data',
    ]);
  });

  it('the contents come straight after the masthead when the overview is not first', () => {
    const b = withLayout({ sections: ['series', 'overview', 'cautions'] });
    const doc = buildDocument(b, briefView(b));
    expect(doc.sections.map((s) => s.name).slice(0, 3)).toEqual(['masthead', 'contents', 'series']);
  });

  it('a note every overview row shares is said once, in its column header', () => {
    const doc = buildDocument(brief, briefView(brief));
    const block = doc.sections.find((s) => s.name === 'overview')?.blocks.find((b) => b.kind === 'overview');
    if (block?.kind !== 'overview') throw new Error('no overview block');
    // The unusual periods' span is the same for both series: said once, in the header.
    expect(block.headers[4]).toMatch(/^Unusual periods \S/);
    for (const row of block.rows) expect(row.cells[3].note).toBe('');
    // The two series end in different months, so each row keeps its own period under its latest value;
    // with one series' period for both, the period moves to the header.
    const periods = briefView(brief).series.map((v) => v.reportingPeriod);
    expect(new Set(periods).size).toBe(2);
    expect(block.headers[1]).toBe('Latest value');
    expect(block.rows.map((r) => r.cells[0].note)).toEqual(periods);
    const same = buildDocument(
      { ...brief, series: [brief.series[0], brief.series[0]] },
      briefView({ ...brief, series: [brief.series[0], brief.series[0]] }),
    );
    const one = same.sections.find((s) => s.name === 'overview')?.blocks.find((b) => b.kind === 'overview');
    if (one?.kind !== 'overview') throw new Error('no overview block');
    expect(one.headers[1]).toBe(`Latest value, ${periods[0]}`);
    for (const row of one.rows) expect(row.cells[0].note).toBe('');
  });

  it('a part left out is gone from every format, and the order chosen holds in every format', async () => {
    const b = withLayout({ sections: ['cautions', 'series'], seriesSections: ['charts', 'headline'] });
    const f = await formats(b);
    for (const [name, text] of Object.entries(f)) {
      if (name === 'pdf' && !hasPoppler) continue;
      for (const gone of [
        'Comparisons',
        'Appendix A: method',
        'Appendix B: data',
        'At a glance',
        'Firmness and sensitivity',
      ])
        expect(text.includes(gone), `${name} still has ${gone}`).toBe(false);
    }
    // Cautions first, then the series; in a series the charts before the headline.
    const headline = b.series[0].statements.find((s) => s.kind === 'headline')?.text as string;
    const chartTitle = b.series[0].charts[0].title;
    const order = (text: string, first: string, second: string) => {
      const i = text.indexOf(first);
      const j = text.indexOf(second);
      expect(i, first).toBeGreaterThanOrEqual(0);
      expect(j, second).toBeGreaterThan(i);
    };
    order(f.html, 'id="cautions"', 'id="series-water"');
    order(f.html, chartTitle, headline);
    order(f.emailText, 'Read with care', headline);
    order(f.emailHtml, 'Read with care', chartTitle);
    if (hasPoppler) order(f.pdf, 'Read with care', headline.slice(0, 40));
    // The key figures were left out too.
    expect(f.html.includes('class="key-figures"')).toBe(false);
    expect(f.emailText.includes('Key figures')).toBe(false);
  }, 120_000);

  it('the data appendix lists the latest data_periods periods, or every one with all', () => {
    const n = brief.series[0].components.dates.length;
    const rows = (b: Brief) => {
      const html = renderHtml(b);
      const table = /<table class="table-data">([\s\S]*?)<\/table>/.exec(html)?.[1] ?? '';
      return (table.split('<tbody>')[1]?.match(/<tr>/g) ?? []).length;
    };
    expect(rows(withLayout({ dataPeriods: 12 }))).toBe(12);
    expect(renderHtml(withLayout({ dataPeriods: 12 }))).toContain(`The latest 12 of ${n} periods are listed`);
    expect(rows(withLayout({ dataPeriods: null }))).toBe(n);
  });
});

describe('the overview', () => {
  it('shows each series’ overview statement as a row: latest value, trend, revision, unusual periods, sparkline', () => {
    const html = renderHtml(brief);
    const table = /<table class="table-overview">([\s\S]*?)<\/table>/.exec(html)?.[1] ?? '';
    expect(table.match(/<th scope="row">/g)?.length).toBe(2);
    for (const s of brief.series) {
      const st = s.statements.find((x) => x.kind === 'overview');
      expect(st, s.id).toBeDefined();
      const fig = (name: string) => st?.figures.find((f) => f.name === name)?.formatted as string;
      // The statement's figures are the cells' words.
      expect(table).toContain(`href="#series-${s.id}"`);
      expect(table).toContain(`${fig('latest')} ${s.unit}`);
      expect(table).toContain(fig('latestPeriod'));
      expect(table).toContain(fig('unusualSpan'));
      expect(st?.text).toContain(fig('latest'));
    }
    // One sparkline per series, inline SVG in the HTML.
    expect(table.match(/<svg/g)?.length).toBe(2);
  });

  it('makes claims the verifier checks, and the verifier catches a wrong latest value', () => {
    expect(verifyBrief(brief)).toEqual([]);
    const s = brief.series[0];
    const st = s.statements.find((x) => x.kind === 'overview');
    const claim = st?.claims.find((c) => c.kind === 'latest-value');
    expect(claim).toBeDefined();
    const wrong = structuredClone(s);
    const bad = wrong.statements.find((x) => x.kind === 'overview')?.claims.find((c) => c.kind === 'latest-value');
    if (bad?.kind === 'latest-value') bad.value += 1;
    const findings = verifyBrief({ ...brief, series: [wrong] });
    expect(findings.map((f) => f.claim)).toContain('latest-value');
  });

  it('is left out of a brief of one series', () => {
    const one = { ...brief, series: [brief.series[0]] };
    const html = renderHtml(one);
    expect(html.includes('<table class="table-overview">')).toBe(false);
    expect(html.includes('id="overview"')).toBe(false);
  });
});

describe('the PDF’s pages', () => {
  it.skipIf(!hasPoppler)(
    'never end the method appendix with "This run" alone: the data appendix follows on its page',
    async () => {
      // Found: the data appendix always began a new page, so the five-row "This run" table could stand alone.
      const file = join(dir, 'pages.pdf');
      writeFileSync(file, await renderPdf(brief));
      const pages = pdfText(file).split('\f');
      const i = pages.findIndex((p) => p.includes('This run'));
      expect(i).toBeGreaterThan(0);
      expect(pages[i]).toContain('Appendix B: data');
    },
    120_000,
  );

  it.skipIf(!hasPoppler)(
    'hold the overview whole on the first page, and each series from a page of its own',
    async () => {
      const file = join(dir, 'first.pdf');
      writeFileSync(file, await renderPdf(brief));
      const pages = pdfText(file).split('\f');
      expect(pages[0]).toContain('At a glance');
      for (const s of brief.series) expect(pages[0]).toContain(s.label);
      const starts = brief.series.map((s) => pages.findIndex((p, k) => k > 0 && p.trimStart().includes(s.label)));
      for (const k of starts) expect(k).toBeGreaterThan(0);
    },
    120_000,
  );
});

describe('the email', () => {
  it('marks every row header of its tables as a header (th scope="row")', async () => {
    const f = await formats(brief);
    const bodies = [...f.emailHtml.matchAll(/<tbody>([\s\S]*?)<\/tbody>/g)].map((m) => m[1]);
    const data = bodies.filter((b) => b.includes('<th') || b.includes('border-bottom:1px solid #dde1e5'));
    expect(data.length).toBeGreaterThan(0);
    for (const body of data) {
      for (const row of body.split('<tr>').slice(1)) {
        if (!row.includes('border-bottom:1px solid #dde1e5')) continue;
        expect(row.trimStart().startsWith('<th scope="row"'), row.slice(0, 80)).toBe(true);
      }
    }
  }, 120_000);
});

describe('the job file', () => {
  const job = (extra: string) => {
    const d = mkdtempSync(join(tmpdir(), 'tb-document-job-'));
    const text = `brief:\n  title: T\n${extra}series:\n  - id: a\n    label: A\n    combine: sum\n    data: { file: x.csv, date: d, value: v }\n`;
    writeFileSync(join(d, 'x.csv'), 'd,v\n2020-01-01,1\n');
    writeFileSync(join(d, 'job.yaml'), text);
    return join(d, 'job.yaml');
  };
  const failure = (path: string): string => {
    try {
      loadJob(path);
    } catch (e) {
      if (e instanceof BriefError) return e.oneLine();
      throw e;
    }
    throw new Error('expected an error');
  };

  it('refuses sections without cautions, at the list’s line', () => {
    const path = job('  sections: [series, method]\n');
    expect(failure(path)).toMatch(new RegExp(`^${path}:3:\\d+: brief.sections leaves out cautions`));
  });

  it('refuses a section name it does not know, at its place, naming the ones there are', () => {
    const path = job('  sections: [series, cautions, summary]\n');
    expect(failure(path)).toMatch(new RegExp(`^${path}:3:\\d+: .*overview, series, cautions, method, data`));
  });

  it('reads data_periods: all as every period', () => {
    const path = job('  data_periods: all\n');
    expect(loadJob(path).brief.layout.dataPeriods).toBeNull();
  });
});
