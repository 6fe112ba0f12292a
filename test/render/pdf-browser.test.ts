/**
 * The browser PDF engine: how it finds a browser, what it says when there is none (one line, exit code 1),
 * what it adds to the HTML and the furniture, and — when a Chromium is present — a printed brief read
 * back by poppler. Without a browser the printing test is skipped, unless TRENDBRIEF_REQUIRE_BROWSER=1
 * (set in CI), which turns the skip into a failure.
 */
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { main } from '../../src/cli/main.js';
import { BriefError } from '../../src/errors.js';
import {
  escapeHtml,
  findBrowser,
  furnitureTemplates,
  printable,
  renderBrowserPdf,
  STANDARD_PATHS,
} from '../../src/render/browser-pdf.js';
import { renderHtml } from '../../src/render/html.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { exampleBriefs } from './files-pdf/examples.js';
import { normalise, pdfInfo, pdfText } from './files-pdf/poppler.js';

const required = process.env.TRENDBRIEF_REQUIRE_BROWSER === '1';
let executable: string | null = null;
try {
  executable = findBrowser();
} catch {
  executable = null;
}

describe('finding the browser', () => {
  it('takes CHROMIUM_PATH first, then PUPPETEER_EXECUTABLE_PATH, then the standard paths', () => {
    const all = () => true;
    expect(findBrowser({ CHROMIUM_PATH: '/opt/a', PUPPETEER_EXECUTABLE_PATH: '/opt/b' }, all)).toBe('/opt/a');
    expect(findBrowser({ PUPPETEER_EXECUTABLE_PATH: '/opt/b' }, all)).toBe('/opt/b');
    expect(findBrowser({}, (p) => p === '/usr/bin/google-chrome')).toBe('/usr/bin/google-chrome');
    expect(findBrowser({}, all)).toBe(STANDARD_PATHS[0]);
  });

  it('names a CHROMIUM_PATH that points nowhere instead of quietly using another browser', () => {
    expect(() => findBrowser({ CHROMIUM_PATH: '/nowhere/chromium' }, (p) => p !== '/nowhere/chromium')).toThrow(
      /CHROMIUM_PATH is set to \/nowhere\/chromium/,
    );
  });

  it('fails with one line, exit code 1 and a way out when there is no browser', () => {
    let error: unknown;
    try {
      findBrowser({}, () => false);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(BriefError);
    const e = error as BriefError;
    expect(e.exitCode).toBe(1);
    expect(e.oneLine()).not.toContain('\n');
    expect(e.oneLine()).toContain('CHROMIUM_PATH');
    expect(e.oneLine()).toContain('--pdf-engine builtin');
  });
});

describe('trendbrief render --pdf-engine browser without a browser', () => {
  it('prints one line and exits with 1 before rendering anything', async () => {
    const out = mkdtempSync(join(tmpdir(), 'trendbrief-no-browser-'));
    const saved = process.env.CHROMIUM_PATH;
    process.env.CHROMIUM_PATH = join(out, 'no-such-chromium');
    const lines: string[] = [];
    const spy = vi.spyOn(process.stderr, 'write').mockImplementation((chunk: string | Uint8Array) => {
      lines.push(
        ...String(chunk)
          .split('\n')
          .filter((l) => l !== ''),
      );
      return true;
    });
    try {
      const code = await main([
        'render',
        'examples/online-orders/job.yaml',
        '--out',
        out,
        '--format',
        'pdf',
        '--pdf-engine',
        'browser',
      ]);
      expect(code).toBe(1);
    } finally {
      spy.mockRestore();
      if (saved === undefined) delete process.env.CHROMIUM_PATH;
      else process.env.CHROMIUM_PATH = saved;
    }
    expect(lines).toHaveLength(1);
    expect(lines[0]).toContain('no-such-chromium');
    expect(lines[0]).toContain('--pdf-engine builtin');
    expect(readdirSync(out)).toEqual([]);
    rmSync(out, { recursive: true, force: true });
  });
});

describe('what the browser is given', () => {
  let brief: Brief;
  beforeAll(async () => {
    brief = (await exampleBriefs('water-deliveries'))[0];
  });

  it('escapes the job’s text in the header and footer templates', () => {
    const odd = {
      ...brief,
      meta: { ...brief.meta, title: '<img src=x onerror=alert(1)> & more', organisation: 'A "quoted" org' },
    };
    const { headerTemplate, footerTemplate } = furnitureTemplates(odd);
    expect(headerTemplate).toContain('&lt;img src=x onerror=alert(1)&gt; &amp; more');
    expect(headerTemplate).not.toContain('<img');
    expect(headerTemplate).toContain('A &quot;quoted&quot; org');
    expect(footerTemplate).toContain('<span class="pageNumber"></span>');
    expect(footerTemplate).toContain('<span class="totalPages"></span>');
    expect(escapeHtml(`'`)).toBe('&#39;');
  });

  it('embeds the fonts as data and switches off the stylesheet’s own page counter', () => {
    const html = printable('<html><head><title>t</title></head><body></body></html>');
    const head = html.slice(0, html.indexOf('</head>'));
    expect(head.match(/@font-face/g)?.length).toBe(4);
    expect(head).toContain('src:url(data:font/ttf;base64,');
    expect(head).toContain('@page{@bottom-right{content:none}}');
    expect(html).not.toMatch(/url\((?!data:)/);
  });
});

if (!executable && required) {
  describe('printing with a browser', () => {
    it('needs a browser because TRENDBRIEF_REQUIRE_BROWSER=1', () => {
      expect.fail('no Chromium found: install chromium or set CHROMIUM_PATH');
    });
  });
}

describe.skipIf(!executable)(
  `printing with a browser (${executable ?? 'none found: skipped; set CHROMIUM_PATH to run'})`,
  () => {
    let dir: string;
    beforeAll(() => {
      dir = mkdtempSync(join(tmpdir(), 'trendbrief-browser-pdf-test-'));
    });
    afterAll(() => rmSync(dir, { recursive: true, force: true }));

    it('prints the HTML brief with its headline, on the job’s paper, and leaves no profile behind', async () => {
      const brief = (await exampleBriefs('online-orders'))[0];
      // A folder of this test's own for the profile: counting profiles in the shared temporary folder also
      // counted those of browser tests running beside this one (test/render/browser.ts makes them too), so
      // the test passed or failed with the order the files happened to run in.
      const parent = mkdtempSync(join(dir, 'profiles-'));
      let seen: string[] = [];
      const watcher = setInterval(() => {
        seen = [...new Set([...seen, ...readdirSync(parent)])];
      }, 20);
      let pdf: Buffer;
      try {
        pdf = await renderBrowserPdf(renderHtml(brief), brief, {
          executablePath: executable as string,
          profileParent: parent,
        });
      } finally {
        clearInterval(watcher);
      }
      // The profile was made there, and nothing is left of it.
      expect(seen.length).toBe(1);
      expect(seen[0]).toMatch(/^trendbrief-chromium-/);
      expect(readdirSync(parent)).toEqual([]);
      const file = join(dir, 'browser.pdf');
      writeFileSync(file, pdf);
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      const text = normalise(pdfText(file));
      expect(text).toContain(normalise(brief.series[0].statements.find((s) => s.kind === 'headline')?.text ?? '∅'));
      expect(text).toMatch(/Page 1 of \d+/);
      // US Letter, 8.5 × 11 in = 612 × 792 pt; Chromium rounds to whole pixels at 96 dpi.
      const [w, h] = pdfInfo(file)
        ['Page size'].split(' ')
        .filter((x) => /^[\d.]+$/.test(x))
        .map(Number);
      expect(Math.abs(w - 612)).toBeLessThan(1);
      expect(Math.abs(h - 792)).toBeLessThan(1);
    });
  },
);
