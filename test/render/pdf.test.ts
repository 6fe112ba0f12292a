/**
 * The built-in PDF brief of each example, read back by qpdf and poppler (tools outside the project): the
 * file is sound, says what the display view says, embeds its fonts, keeps inside its margins, draws its
 * charts, carries its tags and metadata, and is the same bytes on every run.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { briefView, dataTable } from '../../src/document/view.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { exampleBriefs } from './files-pdf/examples.js';
import { pdfaFindings } from './files-pdf/pdfa.js';
import {
  grayPage,
  inkShare,
  normalise,
  pdfFonts,
  pdfInfo,
  pdfStrings,
  pdfText,
  qdf,
  run,
  wordBoxes,
} from './files-pdf/poppler.js';

/** The PDF standard 14 fonts (ISO 32000-1 §9.6.2.2), which a viewer substitutes and we must never use. */
const STANDARD_14 = /^(Times-|Helvetica|Courier|Symbol|ZapfDingbats)/;
/** 18 mm in points: 18 / 25.4 × 72. */
const MARGIN = (18 / 25.4) * 72;

const EXAMPLES = [
  { name: 'water-deliveries', size: [595.28, 841.89] },
  { name: 'online-orders', size: [612, 792] },
  { name: 'clinic-visits', size: [595.28, 841.89] },
] as const;

let dir: string;
const files = new Map<string, string>();
const briefs = new Map<string, Brief>();

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-pdf-test-'));
  for (const ex of EXAMPLES) {
    const brief = (await exampleBriefs(ex.name))[0];
    briefs.set(ex.name, brief);
    const file = join(dir, `${ex.name}.pdf`);
    writeFileSync(file, await renderPdf(brief));
    files.set(ex.name, file);
  }
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe.each(EXAMPLES)('the PDF brief of $name', (ex) => {
  it('passes qpdf --check', () => {
    expect(run('qpdf', ['--check', files.get(ex.name) as string])).toContain('No syntax or stream encoding errors');
  });

  it('holds the headline and every cell of the comparison table', () => {
    const view = briefView(briefs.get(ex.name) as Brief);
    const text = normalise(pdfText(files.get(ex.name) as string));
    for (const s of view.series) {
      expect(text.includes(normalise(s.headline.text)), s.headline.text).toBe(true);
      expect(s.comparisons.rows.length).toBeGreaterThan(0);
      for (const row of s.comparisons.rows)
        for (const cell of row) expect(text.includes(normalise(cell)), cell).toBe(true);
    }
  });

  it('embeds every font it uses and none of the standard 14', () => {
    const fonts = pdfFonts(files.get(ex.name) as string);
    expect(fonts.length).toBeGreaterThan(0);
    for (const f of fonts) {
      expect(f.embedded, f.name).toBe(true);
      expect(f.name.replace(/^[A-Z]{6}\+/, '')).not.toMatch(STANDARD_14);
      expect(f.name).toContain('SourceSans3');
    }
  });

  it('has the page size of the job and is tagged', () => {
    const info = pdfInfo(files.get(ex.name) as string);
    const [w, h] = info['Page size']
      .split(' ')
      .filter((x) => /^[\d.]+$/.test(x))
      .map(Number);
    expect([w, h]).toEqual([...ex.size]);
    expect(info.Tagged).toBe('yes');
    expect(info.Title).toBe((briefs.get(ex.name) as Brief).meta.title);
  });

  it('keeps every word inside the 18 mm margins', () => {
    const words = wordBoxes(files.get(ex.name) as string);
    expect(words.length).toBeGreaterThan(500);
    // pdftotext's boxes run from the font's ascent to its descent; 0.5 pt covers its rounding.
    for (const w of words) {
      const inside =
        w.xMin >= MARGIN - 0.5 &&
        w.yMin >= MARGIN - 0.5 &&
        w.xMax <= w.pageWidth - MARGIN + 0.5 &&
        w.yMax <= w.pageHeight - MARGIN + 0.5;
      expect(inside, `"${w.text}" on page ${w.page} at ${w.xMin},${w.yMin}–${w.xMax},${w.yMax}`).toBe(true);
    }
  });

  it('never leaves a heading or a table caption as the last line of a page', () => {
    const view = briefView(briefs.get(ex.name) as Brief);
    const headings = new Set([
      'In this brief',
      'Read with care',
      'Appendix A: method',
      'Appendix B: data',
      'Published sources',
      'Data read',
      'This run',
      'Comparisons',
      'Unusual periods',
      'Firmness and sensitivity',
    ]);
    for (const s of view.series) {
      headings.add(s.label);
      headings.add(`${s.label} (${s.unit})`);
      for (const t of [s.comparisons, s.unusual, s.revisions, s.method]) if (t) headings.add(normalise(t.caption));
    }
    const words = wordBoxes(files.get(ex.name) as string);
    const pages = Math.max(...words.map((w) => w.page));
    for (let p = 1; p <= pages; p++) {
      // The body ends 24 pt above the bottom margin, where the footer band begins.
      const body = words.filter((w) => w.page === p && w.yMax < w.pageHeight - MARGIN - 24);
      const lastTop = Math.max(...body.map((w) => w.yMin));
      const last = normalise(
        body
          .filter((w) => Math.abs(w.yMin - lastTop) < 2)
          .sort((a, b) => a.xMin - b.xMin)
          .map((w) => w.text)
          .join(' '),
      );
      expect(headings.has(last), `page ${p} ends with "${last}"`).toBe(false);
    }
  });

  it('draws the first chart where it stands (ink in its box, none in the empty margin)', () => {
    const file = files.get(ex.name) as string;
    const chart = (briefs.get(ex.name) as Brief).series[0].charts[0];
    const caption = chart.caption.split(' ').slice(0, 3).join(' ');
    // The chart sits below its caption, which pdftotext finds word by word.
    const words = wordBoxes(file);
    const first = words.findIndex(
      (_, i) =>
        normalise(
          words
            .slice(i, i + 3)
            .map((x) => x.text)
            .join(' '),
        ) === caption,
    );
    expect(first).toBeGreaterThanOrEqual(0);
    const at = words[first];
    const img = grayPage(file, at.page, 50, dir);
    const box = { x0: MARGIN, y0: at.yMax + 8, x1: at.pageWidth - MARGIN, y1: at.yMax + 8 + chart.height * 0.75 - 10 };
    // An empty box reads 0; a drawn chart (axes, grid, labels, lines) inks several percent of its box.
    expect(inkShare(img, 50, box)).toBeGreaterThan(0.03);
    expect(inkShare(img, 50, { x0: 0, y0: 0, x1: MARGIN - 2, y1: at.pageHeight })).toBe(0);
  });

  it('repeats the data table header on every page of the data appendix and prints every row', () => {
    const file = files.get(ex.name) as string;
    const view = briefView(briefs.get(ex.name) as Brief);
    const s = (briefs.get(ex.name) as Brief).series[0];
    // The latest 400 periods (brief.data_periods' default).
    const table = dataTable(s, view.locale, s.components.dates.length - 400);
    const pages = Number(pdfInfo(file).Pages);
    const start = Array.from({ length: pages }, (_, i) => i + 1).find((p) =>
      pdfText(file, { first: p, last: p }).includes('Appendix B: data'),
    );
    expect(start).toBeDefined();
    for (let p = start as number; p <= pages; p++) {
      const header = normalise(pdfText(file, { first: p, last: p, layout: true }));
      expect(header, `page ${p}`).toContain(normalise(table.headers.join(' ')));
    }
    const lines = new Set(pdfText(file, { first: start, layout: true }).split('\n').map(normalise));
    for (const row of table.rows) expect(lines.has(normalise(row.join(' '))), row.join(' ')).toBe(true);
  });
});

describe('determinism and metadata', () => {
  it('gives the same bytes on two runs, and other bytes for another generation time', async () => {
    const brief = briefs.get('water-deliveries') as Brief;
    const a = await renderPdf(brief);
    const b = await renderPdf(brief);
    expect(a.equals(b)).toBe(true);
    const later = await renderPdf({
      ...brief,
      provenance: { ...brief.provenance, generatedAt: '2024-01-01T00:00:00.000Z' },
    });
    expect(later.equals(a)).toBe(false);
    // The trailer /ID is derived from the Info dictionary, dates included, so it moves with them.
    const id = (pdf: Buffer) => /\/ID \[<([0-9a-f]+)>/.exec(pdf.toString('latin1'))?.[1];
    expect(id(a)).toBe(id(b));
    expect(id(later)).not.toBe(id(a));
  });

  it('dates the file with the brief’s generation time (which honours SOURCE_DATE_EPOCH)', () => {
    const info = pdfInfo(files.get('water-deliveries') as string);
    // EPOCH 1,700,000,000 s is 2023-11-14 22:13:20 UTC.
    expect(info.CreationDate).toContain('Nov 14 22:13:20 2023');
    expect(info.ModDate).toContain('Nov 14 22:13:20 2023');
    expect(info.Author).toBe('Network analytics team');
    expect(info.Subject).toContain('Water delivered');
    expect(info.Keywords).toContain('trend');
  });

  it('tags headings, paragraphs, tables and figures with the charts’ alt text', () => {
    const brief = briefs.get('water-deliveries') as Brief;
    const text = qdf(files.get('water-deliveries') as string, dir);
    for (const tag of ['Document', 'H1', 'H2', 'H3', 'P', 'Table', 'TR', 'TH', 'TD', 'Figure', 'L', 'LI'])
      expect(text.includes(`/S /${tag}\n`), tag).toBe(true);
    expect(text.includes('/Lang (en-GB)')).toBe(true);
    expect(/\/Marked true/.test(text)).toBe(true);
    const figures = text.match(/\/S \/Figure\n/g) ?? [];
    expect(figures.length).toBe(brief.series[0].charts.length);
    expect(pdfStrings(text, 'Alt')).toEqual(brief.series[0].charts.map((c) => c.alt));
    expect(text.includes('pdfaid:part')).toBe(false);
  });
});

describe('the archival PDF (PDF/A-2b)', () => {
  let file: string;
  beforeAll(async () => {
    file = join(dir, 'archival.pdf');
    writeFileSync(file, await renderPdf(briefs.get('online-orders') as Brief, { archival: true }));
  });

  it('passes qpdf --check and is still tagged and embedded', () => {
    expect(run('qpdf', ['--check', file])).toContain('No syntax or stream encoding errors');
    expect(pdfInfo(file).Tagged).toBe('yes');
    for (const f of pdfFonts(file)) expect(f.embedded).toBe(true);
  });

  it('meets each requirement of PDF/A-2b that its objects show (ISO 19005-2, checked on the parsed file)', () => {
    expect(pdfaFindings(file)).toEqual([]);
    // The dates the XMP carries are the brief's, as the Info dictionary's are.
    const text = qdf(file, dir);
    expect(text.includes('<xmp:CreateDate>2023-11-14T22:13:20Z</xmp:CreateDate>')).toBe(true);
  });

  it('the requirement checks catch a file that breaks them', () => {
    // The ordinary PDF: no PDF/A identification, no output intent.
    const plain = pdfaFindings(files.get('online-orders') as string).join('\n');
    expect(plain).toContain('6.6.4: pdfaid:part is not 2');
    expect(plain).toContain('6.2.3: 0 PDF/A output intents');
    // The archival file with its Info title changed (same length, so the file still reads): XMP disagrees.
    const bytes = readFileSync(file);
    const at = bytes.indexOf('(Online orders)');
    expect(at).toBeGreaterThan(0);
    const changed = Buffer.from(bytes);
    changed.write('(Online ordxrs)', at, 'latin1');
    const changedFile = join(dir, 'archival-changed.pdf');
    writeFileSync(changedFile, changed);
    expect(pdfaFindings(changedFile)).toEqual(['6.6.3: Info /Title "Online ordxrs" but XMP has "Online orders"']);
  });

  it('is deterministic too', async () => {
    const brief = briefs.get('online-orders') as Brief;
    expect((await renderPdf(brief, { archival: true })).equals(await renderPdf(brief, { archival: true }))).toBe(true);
  });

  it('escapes the job’s text inside the XMP packet', async () => {
    const brief = briefs.get('online-orders') as Brief;
    const odd = { ...brief, meta: { ...brief.meta, title: 'Orders & returns <east>', author: 'R&D "North"' } };
    const oddFile = join(dir, 'odd.pdf');
    writeFileSync(oddFile, await renderPdf(odd, { archival: true }));
    const xmp = /<x:xmpmeta[\s\S]*<\/x:xmpmeta>/.exec(qdf(oddFile, dir))?.[0] ?? '';
    expect(xmp.includes('Orders &amp; returns &lt;east&gt;')).toBe(true);
    expect(xmp.includes('R&amp;D &quot;North&quot;')).toBe(true);
    expect(xmp.includes('Orders & returns')).toBe(false);
    expect(pdfInfo(oddFile).Title).toBe('Orders & returns <east>');
    expect(pdfaFindings(oddFile)).toEqual([]);
  });
});

describe('the logo', () => {
  it.each([
    ['PNG', 'image/png', 'logo.png'],
    ['SVG', 'image/svg+xml', 'logo.svg'],
  ])('draws a %s logo above the organisation, tagged as a figure, also in PDF/A', async (_, mime, name) => {
    const brief = briefs.get('water-deliveries') as Brief;
    const bytes = readFileSync(join('test/render/files-pdf', name));
    const withLogo = {
      ...brief,
      meta: { ...brief.meta, logo: { mime, dataUri: `data:${mime};base64,${bytes.toString('base64')}` } },
    };
    const file = join(dir, `logo-${name}.pdf`);
    writeFileSync(file, await renderPdf(withLogo, { archival: true }));
    expect(run('qpdf', ['--check', file])).toContain('No syntax or stream encoding errors');
    expect(pdfaFindings(file)).toEqual([]);
    const text = qdf(file, dir);
    expect(pdfStrings(text, 'Alt')).toContain('Riverside Water Authority logo');
    if (mime === 'image/png') expect(text.includes('/Subtype /Image')).toBe(true);
    // The logo's teal square (about 32 pt wide, its top 41 pt below the margin: the 24 pt header band,
    // the accent rule and its space) is drawn: pdftoppm sees ink all over it.
    const img = grayPage(file, 1, 50, dir);
    expect(inkShare(img, 50, { x0: MARGIN + 3, y0: MARGIN + 45, x1: MARGIN + 27, y1: MARGIN + 68 })).toBeGreaterThan(
      0.9,
    );
  });
});
