/**
 * Tables of the PDF brief under strain, read back with poppler: cells too long for their column wrap
 * (a word longer than the column breaks inside) and nothing is cut or runs past the margins; a table
 * longer than a page carries its header onto every page; a table that fits keeps each row on one line.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type BriefView, briefView, type Table } from '../../src/document/view.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { exampleBriefs } from './files-pdf/examples.js';
import { normalise, pdfInfo, pdfText, run, wordBoxes } from './files-pdf/poppler.js';

const MARGIN = (18 / 25.4) * 72;
/** 70 characters with no break opportunity: wider than any column of an eight-column table. */
const LONG_WORD = 'x'.repeat(30) + '0123456789'.repeat(4);

let dir: string;
let brief: Brief;
let view: BriefView;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-table-test-'));
  brief = (await exampleBriefs('water-deliveries'))[0];
  view = briefView(brief);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function withComparisons(table: Table): Promise<string> {
  const s = view.series[0];
  const file = join(dir, `t-${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, await renderPdf(brief, { view: { ...view, series: [{ ...s, comparisons: table }] } }));
  return file;
}

/** A table of n short rows ("row 1" … "row n"), long enough past a few dozen to cover pages. */
function longTable(n: number): Table {
  return {
    caption: 'A long table',
    headers: ['Label', 'A', 'B', 'N', '2N', 'P', 'Q', 'R'],
    numeric: [false, false, false, true, true, true, true, true],
    rows: Array.from({ length: n }, (_, i) => [
      `row ${i + 1}`,
      'a',
      'b',
      String(i),
      String(2 * i),
      '+1%',
      '+2%',
      '+3%',
    ]),
  };
}

describe('PDF tables', () => {
  it('wraps long cells and breaks over-long words, losing no character and keeping to the margins', async () => {
    const sentence = 'a comparison label long enough to need several lines in a narrow column of the table';
    const table: Table = {
      caption: 'A table too wide for the page',
      headers: [
        'First heading',
        'Second heading here',
        'Third',
        'Fourth heading',
        'Fifth',
        'Sixth heading',
        'Seventh',
        'Eighth',
      ],
      numeric: [false, false, false, true, true, true, true, true],
      rows: [
        [sentence, LONG_WORD, 'short', '1,234', '5,678', '+1.0%', '−2.0%', '+3.0%'],
        ['second row', sentence, LONG_WORD, '9', '10', '11', '12', '13'],
      ],
    };
    const file = await withComparisons(table);
    expect(run('qpdf', ['--check', file])).toContain('No syntax or stream encoding errors');
    const text = pdfText(file);
    // Every word of every cell is there; the long word may be split across lines, so it is checked with
    // the line breaks taken out.
    const flat = normalise(text);
    for (const cell of [...table.headers, ...table.rows.flat()]) {
      if (cell === LONG_WORD) continue;
      for (const word of cell.split(' ')) expect(flat.includes(word), word).toBe(true);
    }
    const joined = text.replace(/\s+/g, '');
    expect(joined.split(LONG_WORD).length - 1).toBe(2);
    for (const w of wordBoxes(file)) {
      expect(
        w.xMin >= MARGIN - 0.5 && w.xMax <= w.pageWidth - MARGIN + 0.5,
        `"${w.text}" at x ${w.xMin}–${w.xMax}`,
      ).toBe(true);
    }
  });

  it('repeats caption and header on every page a long table covers', async () => {
    const table = longTable(150);
    const rows = table.rows;
    const file = await withComparisons(table);
    const pages = Number(pdfInfo(file).Pages);
    const holding: number[] = [];
    for (let p = 1; p <= pages; p++) if (/\brow \d+\b/.test(pdfText(file, { first: p, last: p }))) holding.push(p);
    // 150 rows of about 14 pt do not fit on one A4 page (about 720 pt of body).
    expect(holding.length).toBeGreaterThan(1);
    for (const p of holding) {
      const page = normalise(pdfText(file, { first: p, last: p, layout: true }));
      expect(page, `page ${p}`).toContain('Label A B N 2N P Q R');
      expect(page).toContain('A long table');
    }
    const lines = new Set(pdfText(file, { layout: true }).split('\n').map(normalise));
    for (const row of rows) expect(lines.has(normalise(row.join(' '))), row[0]).toBe(true);
  });

  it('leaves no last page of a long table holding fewer than three rows (no widow rows)', async () => {
    const rowsPerPage = (file: string): number[] => {
      const counts: number[] = [];
      for (let p = 1; p <= Number(pdfInfo(file).Pages); p++) {
        const found = pdfText(file, { first: p, last: p }).match(/\brow \d+\b/g);
        if (found) counts.push(found.length);
      }
      return counts;
    };
    // Measure how many rows fill the first page and a following page, then ask for one row more than
    // those two pages hold: filling pages in order would leave that one row alone on the third page.
    const [first, full] = rowsPerPage(await withComparisons(longTable(150)));
    const n = first + full + 1;
    const file = await withComparisons(longTable(n));
    const counts = rowsPerPage(file);
    expect(counts.reduce((a, b) => a + b, 0)).toBe(n);
    expect(counts.length).toBe(3);
    expect(counts[2]).toBeGreaterThanOrEqual(3);
    expect(counts[1]).toBeGreaterThanOrEqual(3);
    const lines = new Set(pdfText(file, { layout: true }).split('\n').map(normalise));
    for (const row of longTable(n).rows) expect(lines.has(normalise(row.join(' '))), row[0]).toBe(true);
  });

  it('keeps each row of the example comparison table on one line (it fits at full size)', async () => {
    const file = await withComparisons(view.series[0].comparisons);
    const lines = new Set(pdfText(file, { layout: true }).split('\n').map(normalise));
    for (const row of view.series[0].comparisons.rows) expect(lines.has(normalise(row.join(' '))), row[0]).toBe(true);
  });
});
