/**
 * The stylesheet check of template overrides (src/render/css-check.ts), on the ways CSS can name a file
 * without writing "url(" or "@import" plainly: escapes in names (CSS Syntax Level 3, §4.3.7 — an escape
 * is undone before the name is compared, §4.3.4), image-set() and src() whose strings are addresses
 * (CSS Images Level 4, §2.4; CSS Values Level 4, §4.5), custom properties carried into another property by
 * var(), and @font-face sources. Each payload is also loaded in Chromium, which must ask for its address:
 * the cases are real fetches, not guesses. Then a brief whose override passes the check is loaded in
 * Chromium, which must ask for nothing.
 */
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { cssProblem } from '../../src/render/css-check.js';
import { renderHtml } from '../../src/render/html.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { browserRequired, findBrowser, type LaunchedBrowser, launchBrowser } from './browser.js';

/** Payloads that fetch ADDRESS, each on line 2 (after a comment, which may come before @import). */
const FETCHING: [string, string][] = [
  ['escaped url(', '/* line one */\n.a { background: u\\72l(ADDRESS/1.png); }'],
  ['escape with a space', '/* line one */\n.a { background: \\75 rl(ADDRESS/2.png); }'],
  ['escaped @import', '/* line one */\n@\\69mport "ADDRESS/3.css";'],
  ['plain @import url()', '/* line one */\n@import url(ADDRESS/4.css);'],
  ['image-set() with a string', '/* line one */\n.a { background-image: image-set("ADDRESS/5.png" 1x); }'],
  ['-webkit-image-set()', '/* line one */\n.a { background-image: -webkit-image-set("ADDRESS/6.png" 1x); }'],
  ['escapes inside a quoted url', '/* line one */\n.a { background: URL( "h\\74tp:ADDRESS_NO_SCHEME/7.png" ); }'],
  ['a custom property used by var()', '/* line one */\n.a { --img: url(ADDRESS/8.png); background: var(--img); }'],
  ['a font source', '/* line one */\n@font-face { font-family: X; src: url(ADDRESS/9.woff); }\n.a { font-family: X; }'],
  ['a cursor', '/* line one */\n.a { cursor: url(ADDRESS/10.png), auto; }'],
];

/** Stylesheets that fetch nothing and must pass, some with escapes and urls in harmless places. */
const HARMLESS = [
  '.a { background: url(data:image/png;base64,iVBORw0KGgo=); }',
  '.a { filter: url(#shadow); }',
  '.a::after { content: "url(http://example.invalid/) and @import"; }',
  '.\\61 { color: #123456; } /* url(http://example.invalid/) in a comment */',
  '.a { font-family: "Source Sans 3", sans-serif; --gap: 4px; margin: var(--gap); }',
];

const address = (port: number) => `http://127.0.0.1:${port}`;
const fill = (css: string, port: number) =>
  css.replace(/ADDRESS_NO_SCHEME/g, `//127.0.0.1:${port}`).replace(/ADDRESS/g, address(port));

describe('the stylesheet check', () => {
  for (const [name, css] of FETCHING) {
    it(`refuses ${name}`, () => {
      const p = cssProblem(fill(css, 8));
      expect(p, css).not.toBeNull();
      expect(p?.line).toBe(2);
      expect(p?.what).toMatch(/@import|url\(…\)|image-set\(…\)|cannot/);
    });
  }
  for (const css of HARMLESS) it(`accepts ${css}`, () => expect(cssProblem(css)).toBeNull());

  it('refuses a stylesheet that closes the <style> element', () => {
    expect(cssProblem('/* line one */\n</STYLE><script>alert(1)</script>')).toMatchObject({
      line: 2,
      what: 'contains </style',
    });
  });
});

const executable = findBrowser();
if (!executable && browserRequired) {
  describe('stylesheets in Chromium', () => {
    it('needs a browser because TRENDBRIEF_REQUIRE_BROWSER=1', () => {
      throw new Error('no Chromium found; install chromium or set CHROMIUM_PATH');
    });
  });
}

describe.skipIf(!executable)('stylesheets in Chromium', () => {
  let browser: LaunchedBrowser;
  let server: Server;
  let port: number;
  const asked: string[] = [];
  let brief: Brief;

  beforeAll(async () => {
    server = createServer((req, res) => {
      asked.push(req.url ?? '');
      res.writeHead(404).end();
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
    port = (server.address() as AddressInfo).port;
    browser = await launchBrowser(executable as string);
    const [unit] = await buildBriefs(loadJob('test/bad-input/good/job.yaml'), { toolVersion: 'test', charts: true });
    brief = unit.brief as Brief;
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    await new Promise<void>((resolve) => server.close(() => resolve()));
  });

  /** Every request the page made while loading `html`. */
  async function requests(html: string): Promise<string[]> {
    const page = await browser.browser.newPage();
    const seen: string[] = [];
    page.on('request', (r) => seen.push(r.url()));
    await page.setContent(html, { waitUntil: 'load' });
    // Images and fonts are asked for once styles are applied and text is laid out.
    await page.evaluate(() => document.fonts.ready);
    await new Promise((resolve) => setTimeout(resolve, 300));
    await page.close();
    return seen.filter((u) => !u.startsWith('data:') && u !== 'about:blank');
  }

  it('asks for the address of every payload the check refuses (they are real fetches)', async () => {
    for (const [name, css] of FETCHING) {
      const seen = await requests(`<!doctype html><style>${fill(css, port)}</style><p class="a">x</p>`);
      expect(
        seen.some((u) => u.startsWith(address(port))),
        name,
      ).toBe(true);
    }
  }, 60_000);

  it('asks for nothing when it shows a brief whose stylesheet override passes the check', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-css-'));
    mkdirSync(join(dir, 'partials'));
    writeFileSync(join(dir, 'brief.css'), HARMLESS.join('\n'));
    const before = asked.length;
    const seen = await requests(renderHtml(brief, { templatesDir: dir }));
    expect(seen).toEqual([]);
    expect(asked.length).toBe(before);
  }, 60_000);
});
