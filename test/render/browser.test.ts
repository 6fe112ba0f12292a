/**
 * The HTML brief in a real browser (headless Chromium through puppeteer-core): it loads with no console
 * error and no request beyond the file itself, shows its headline, draws something at screen width and in
 * print, fits the printable width of its paper, and prints to at least two pages of the job's paper size.
 * Paper sizes: ISO 216 (A4, 210 × 297 mm = 595.3 × 841.9 pt) and ANSI/ASME Y14.1 (Letter, 8.5 × 11 in = 612 × 792 pt).
 * Without a browser the tests skip, unless TRENDBRIEF_REQUIRE_BROWSER=1 (CI), where they fail.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { Page } from 'puppeteer-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { renderHtml } from '../../src/render/html.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import {
  browserRequired,
  colourSpread,
  decodePng,
  findBrowser,
  type LaunchedBrowser,
  launchBrowser,
} from './browser.js';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '../..');
const executable = findBrowser();

const CASES = [
  { name: 'water-deliveries', job: join(root, 'examples/water-deliveries/job.yaml') },
  { name: 'online-orders', job: join(root, 'examples/online-orders/job.yaml') },
  { name: 'clinic-visits', job: join(root, 'examples/clinic-visits/job.yaml') },
  { name: 'hostile text, two series and a logo', job: join(here, 'files/hostile/job.yaml') },
];

/** Printable width in CSS pixels (96 per inch): paper width less the 18 mm margins on both sides. */
const PRINTABLE_PX = { A4: ((210 - 36) / 25.4) * 96, Letter: ((8.5 * 25.4 - 36) / 25.4) * 96 };
const PAPER_PT = { A4: [595.28, 841.89], Letter: [612, 792] };

if (!executable) {
  const message = 'no Chromium found (looked at CHROMIUM_PATH, PUPPETEER_EXECUTABLE_PATH, /usr/bin/chromium)';
  if (browserRequired) {
    describe('the HTML brief in a browser', () => {
      it('needs a browser because TRENDBRIEF_REQUIRE_BROWSER=1', () => {
        throw new Error(`${message}; install chromium or set CHROMIUM_PATH`);
      });
    });
  } else {
    console.warn(`browser tests skipped: ${message}; set TRENDBRIEF_REQUIRE_BROWSER=1 to make this a failure`);
  }
}

interface Loaded {
  page: Page;
  /** Every URL the page asked for. */
  requests: string[];
  /** Console errors and uncaught page errors. */
  errors: string[];
  url: string;
}

describe.skipIf(!executable)('the HTML brief in a browser', () => {
  let launched: LaunchedBrowser;
  let folder: string;
  const briefs = new Map<string, Brief>();

  beforeAll(async () => {
    folder = mkdtempSync(join(tmpdir(), 'trendbrief-html-'));
    launched = await launchBrowser(executable as string);
    for (const c of CASES) {
      const units = await buildBriefs(loadJob(c.job), { toolVersion: 'test', charts: true, epoch: 1767225600 });
      if (units[0].error) throw units[0].error;
      briefs.set(c.name, units[0].brief as Brief);
    }
  }, 120_000);

  afterAll(async () => {
    await launched?.close();
    if (folder) rmSync(folder, { recursive: true, force: true });
  });

  async function load(name: string, html: string): Promise<Loaded> {
    const file = join(folder, `${name.replace(/\W+/g, '-')}.html`);
    writeFileSync(file, html);
    const url = pathToFileURL(file).href;
    const page = await launched.browser.newPage();
    const requests: string[] = [];
    const errors: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
    page.on('pageerror', (e) => errors.push(String(e)));
    // Every request is seen here, and anything but the page itself is stopped before it leaves.
    await page.setRequestInterception(true);
    page.on('request', (r) => {
      requests.push(r.url());
      if (r.url() === url || r.url().startsWith('data:')) r.continue();
      else r.abort();
    });
    await page.setViewport({ width: 1280, height: 900 });
    await page.goto(url, { waitUntil: 'load' });
    return { page, requests, errors, url };
  }

  it.each(CASES.map((c) => c.name))(
    '%s: loads with no errors, no network request, and shows its headline',
    async (name) => {
      const brief = briefs.get(name) as Brief;
      const { page, requests, errors, url } = await load(name, renderHtml(brief));
      try {
        expect(errors).toEqual([]);
        // An embedded logo is a data: URI, decoded in the page; nothing else may be asked for.
        expect(requests.filter((r) => !r.startsWith('data:'))).toEqual([url]);
        const headline = brief.series[0].statements.find((s) => s.kind === 'headline')?.text as string;
        const shown = await page.evaluate(() => document.querySelector('.headline')?.textContent ?? '');
        expect(shown).toBe(headline);
        const title = await page.evaluate(() => document.querySelector('h1')?.textContent ?? '');
        expect(title).toBe(brief.meta.title);
        // Nothing from the job became a script: the document holds no script element at all.
        expect(await page.evaluate(() => document.querySelectorAll('script').length)).toBe(0);
      } finally {
        await page.close();
      }
    },
  );

  it('tells a blank screenshot from a drawn one (the check below can fail)', async () => {
    const { page } = await load(
      'blank',
      '<!DOCTYPE html><html lang="en"><head><title>x</title></head><body style="background:#0a141e"></body></html>',
    );
    try {
      const png = decodePng(await page.screenshot({ type: 'png' }));
      expect([png.width, png.height]).toEqual([1280, 900]);
      // A page painted one colour decodes to exactly that colour everywhere.
      expect(colourSpread(png)).toEqual({ distinct: 1, differentFromFirst: 0 });
      expect([...png.pixels.subarray(0, 3)]).toEqual([0x0a, 0x14, 0x1e]);
    } finally {
      await page.close();
    }
  });

  it.each(CASES.map((c) => c.name))(
    '%s: draws at screen width and in print, fits the paper, prints several pages',
    async (name) => {
      const brief = briefs.get(name) as Brief;
      const { page, errors } = await load(name, renderHtml(brief));
      try {
        const screen = colourSpread(decodePng(await page.screenshot({ type: 'png' })));
        // Text, rules and chart colours: far more than a handful of colours, and well over 1% of pixels inked.
        expect(screen.distinct).toBeGreaterThan(20);
        expect(screen.differentFromFirst).toBeGreaterThan(0.01);

        await page.emulateMediaType('print');
        const width = Math.floor(PRINTABLE_PX[brief.meta.pageSize]);
        await page.setViewport({ width, height: 1100 });
        const print = colourSpread(decodePng(await page.screenshot({ type: 'png' })));
        expect(print.distinct).toBeGreaterThan(20);
        expect(print.differentFromFirst).toBeGreaterThan(0.01);

        // At the printable width nothing sticks out: no table, figure or chart wider than the page's column.
        const layout = await page.evaluate(() => {
          const main = document.querySelector('main') as HTMLElement;
          const right = main.getBoundingClientRect().right;
          const wide = [...document.querySelectorAll('table, figure, svg, dl, p')]
            .filter((e) => e.getBoundingClientRect().right > right + 1)
            .map((e) => `${e.tagName.toLowerCase()}.${(e as HTMLElement).className || ''}`);
          const thead = document.querySelector('.table-data thead') as HTMLElement;
          const data = document.querySelector('.appendix-data') as HTMLElement;
          const figure = document.querySelector('figure.chart') as HTMLElement;
          return {
            scroll: document.documentElement.scrollWidth,
            wide,
            thead: getComputedStyle(thead).display,
            dataBreak: getComputedStyle(data).breakBefore,
            figureBreak: getComputedStyle(figure).breakInside,
            bodySize: getComputedStyle(document.body).fontSize,
          };
        });
        expect(layout.wide).toEqual([]);
        expect(layout.scroll).toBeLessThanOrEqual(width);
        expect(layout.thead).toBe('table-header-group');
        expect(layout.dataBreak).toBe('page');
        expect(layout.figureBreak).toBe('avoid');
        // 10.5 pt = 14 CSS px (1 pt = 96/72 px).
        expect(layout.bodySize).toBe('14px');

        const pdf = Buffer.from(await page.pdf({ preferCSSPageSize: true, printBackground: true }));
        const text = pdf.toString('latin1');
        const pages = text.match(/\/Type\s*\/Page\b(?!s)/g)?.length ?? 0;
        expect(pages).toBeGreaterThanOrEqual(2);
        const box = /\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/.exec(text);
        const [w, h] = PAPER_PT[brief.meta.pageSize];
        // Chromium rounds the page to whole CSS pixels: within 1 pt of the paper size.
        expect(Math.abs(Number(box?.[1]) - w)).toBeLessThan(1);
        expect(Math.abs(Number(box?.[2]) - h)).toBeLessThan(1);
        expect(errors).toEqual([]);
      } finally {
        await page.close();
      }
    },
  );
});
