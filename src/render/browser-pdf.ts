/**
 * The alternative PDF engine: the HTML brief printed by a Chromium already on the machine, through
 * puppeteer-core (which downloads nothing). The browser runs headless from a fresh profile in a temporary
 * folder, removed afterwards, and every network request is refused: the page is self-contained, so
 * anything it tried to fetch would be a leak. Running header and footer carry the same facts as the
 * built-in engine's.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Face, sourceSansFile } from '../chart/fonts.js';
import { briefView } from '../document/view.js';
import { WORDS } from '../document/words.js';
import { BriefError } from '../errors.js';
import type { Brief } from '../vocabulary/brief.js';

export interface BrowserPdfOptions {
  /** The browser to run; by default found by findBrowser. */
  executablePath?: string;
  env?: NodeJS.ProcessEnv;
  /** Longest wait for the browser to start and to print, in milliseconds. */
  timeoutMs?: number;
  /** The folder the browser's throwaway profile is made in (and removed from); the system's temporary folder by default. */
  profileParent?: string;
}

/** Where a system Chromium or Chrome usually lives (Debian and Ubuntu packages, Google's package). */
export const STANDARD_PATHS = ['/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/bin/google-chrome'];

export const BROWSER_FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

const HINT = 'install chromium or set CHROMIUM_PATH to a Chromium or Chrome executable, or use --pdf-engine builtin';

/**
 * The browser to print with: CHROMIUM_PATH, else PUPPETEER_EXECUTABLE_PATH, else the first standard path
 * that exists. A variable naming a missing file is an error rather than a silent fall-through.
 */
export function findBrowser(
  env: NodeJS.ProcessEnv = process.env,
  exists: (path: string) => boolean = existsSync,
): string {
  for (const name of ['CHROMIUM_PATH', 'PUPPETEER_EXECUTABLE_PATH']) {
    const path = env[name];
    if (path) {
      if (exists(path)) return path;
      throw new BriefError('browser-missing', `${name} is set to ${path}, but no file is there`, HINT, {}, 1);
    }
  }
  const found = STANDARD_PATHS.find((p) => exists(p));
  if (found) return found;
  throw new BriefError(
    'browser-missing',
    `no Chromium or Chrome found for --pdf-engine browser (looked in ${STANDARD_PATHS.join(', ')})`,
    HINT,
    {},
    1,
  );
}

export async function renderBrowserPdf(html: string, brief: Brief, options: BrowserPdfOptions = {}): Promise<Buffer> {
  const executablePath = options.executablePath ?? findBrowser(options.env ?? process.env);
  const timeout = options.timeoutMs ?? 60_000;
  const { default: puppeteer } = await import('puppeteer-core');
  const profile = mkdtempSync(join(options.profileParent ?? tmpdir(), 'trendbrief-chromium-'));
  let browser: Awaited<ReturnType<typeof puppeteer.launch>> | null = null;
  try {
    browser = await puppeteer.launch({
      executablePath,
      headless: true,
      userDataDir: profile,
      args: BROWSER_FLAGS,
      pipe: true,
      timeout,
    });
    const page = await browser.newPage();
    await page.setRequestInterception(true);
    page.on('request', (request) => {
      if (request.url().startsWith('data:')) void request.continue();
      else void request.abort('blockedbyclient');
    });
    await page.setContent(printable(html), { waitUntil: 'load', timeout });
    const pdf = await page.pdf({
      format: brief.meta.pageSize === 'Letter' ? 'letter' : 'a4',
      printBackground: true,
      displayHeaderFooter: true,
      ...furnitureTemplates(brief),
      preferCSSPageSize: true,
      margin: { top: '18mm', right: '18mm', bottom: '20mm', left: '18mm' },
      tagged: true,
      outline: true,
      timeout,
    });
    return stampDates(Buffer.from(pdf), new Date(brief.provenance.generatedAt));
  } catch (e) {
    if (e instanceof BriefError) throw e;
    const message = e instanceof Error ? e.message.split('\n')[0] : String(e);
    throw new BriefError(
      'browser-failed',
      `the browser at ${executablePath} could not print the brief: ${message}`,
      HINT,
      {},
      1,
    );
  } finally {
    if (browser) await browser.close().catch(() => browser?.process()?.kill('SIGKILL'));
    rmSync(profile, { recursive: true, force: true });
  }
}

/** The faces the stylesheet asks for, as CSS weight and style. */
const FACES: [Face, number, 'normal' | 'italic'][] = [
  ['Regular', 400, 'normal'],
  ['It', 400, 'italic'],
  ['Semibold', 600, 'normal'],
  ['Bold', 700, 'normal'],
];

let fontCss: string | undefined;

/**
 * The HTML brief made ready for Chromium's printer: Source Sans 3 embedded as data URIs, so the print
 * matches the built-in engine's type without the font installed and without a fetch, and the stylesheet's
 * own page counter switched off, since the footer template below carries "Page X of Y".
 */
export function printable(html: string): string {
  if (fontCss === undefined) {
    fontCss = FACES.map(
      ([face, weight, style]) =>
        `@font-face{font-family:"Source Sans 3";font-weight:${weight};font-style:${style};src:url(data:font/ttf;base64,${readFileSync(sourceSansFile(face)).toString('base64')}) format("truetype")}`,
    ).join('\n');
  }
  const style = `<style>\n${fontCss}\n@page{@bottom-right{content:none}}\n</style>\n`;
  const head = html.search(/<\/head>/i);
  return head >= 0 ? html.slice(0, head) + style + html.slice(head) : style + html;
}

/**
 * Chromium's header and footer templates: the title and organisation above, the generation time, data
 * fingerprint and page count below. Chromium fills the pageNumber and totalPages spans; everything else
 * is escaped text.
 */
export function furnitureTemplates(brief: Brief): { headerTemplate: string; footerTemplate: string } {
  const view = briefView(brief);
  const box = (left: string, right: string) =>
    `<div style="box-sizing:border-box;width:100%;padding:0 18mm;display:flex;justify-content:space-between;gap:12pt;font-family:'Source Sans 3','Source Sans Pro',sans-serif;font-size:7.5pt;color:#5b6168"><span>${left}</span><span>${right}</span></div>`;
  return {
    headerTemplate: box(escapeHtml(view.title), escapeHtml(view.organisation)),
    footerTemplate: box(
      escapeHtml(WORDS.pageFoot(view.generatedAt, view.fingerprint)),
      WORDS.pageOf('<span class="pageNumber"></span>', '<span class="totalPages"></span>'),
    ),
  };
}

export function escapeHtml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/**
 * Chromium dates the PDF (CreationDate, ModDate) by the wall clock; the brief's own generation time, which
 * honours SOURCE_DATE_EPOCH, takes their place, so two runs give the same bytes as the built-in engine's do.
 * Each date is replaced by one of the same length (D:YYYYMMDDHHmmSS+00'00', as Chromium writes it), so the
 * cross-reference offsets stay true; a date written in another form is left alone.
 */
export function stampDates(pdf: Buffer, when: Date): Buffer {
  if (Number.isNaN(when.getTime())) return pdf;
  const text = pdf.toString('latin1');
  const stamp = `D:${when.toISOString().slice(0, 19).replace(/[-:T]/g, '')}+00'00'`;
  const stamped = text.replace(/\/(CreationDate|ModDate) \((D:[^)]*)\)/g, (whole, key: string, old: string) =>
    old.length === stamp.length ? `/${key} (${stamp})` : whole,
  );
  return stamped === text ? pdf : Buffer.from(stamped, 'latin1');
}
