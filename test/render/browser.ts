/**
 * Test helper: a headless Chromium (Debian's /usr/bin/chromium, or CHROMIUM_PATH / PUPPETEER_EXECUTABLE_PATH)
 * driven by puppeteer-core with a fresh profile and every background service that could reach the network
 * switched off; and a small PNG reader so a screenshot can be checked for being blank.
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { inflateSync } from 'node:zlib';
import puppeteer, { type Browser } from 'puppeteer-core';
import { BROWSER_FLAGS } from '../../src/render/browser-pdf.js';

/** CI sets this: a missing browser then fails the browser tests instead of skipping them. */
export const browserRequired = process.env.TRENDBRIEF_REQUIRE_BROWSER === '1';

export function findBrowser(): string | null {
  const candidates = [
    process.env.CHROMIUM_PATH,
    process.env.PUPPETEER_EXECUTABLE_PATH,
    '/usr/bin/chromium',
    '/usr/bin/chromium-browser',
  ];
  return candidates.find((p): p is string => typeof p === 'string' && p !== '' && existsSync(p)) ?? null;
}

export { BROWSER_FLAGS };

export interface LaunchedBrowser {
  browser: Browser;
  /** Closes the browser and removes its profile folder. */
  close(): Promise<void>;
}

export async function launchBrowser(executablePath: string): Promise<LaunchedBrowser> {
  const profile = mkdtempSync(join(tmpdir(), 'trendbrief-chromium-'));
  const browser = await puppeteer.launch({
    executablePath,
    headless: true,
    userDataDir: profile,
    args: BROWSER_FLAGS,
  });
  return {
    browser,
    async close() {
      await browser.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export interface Png {
  width: number;
  height: number;
  /** 3 (RGB) or 4 (RGBA). */
  channels: number;
  /** Unfiltered samples, row by row. */
  pixels: Uint8Array;
}

/**
 * Decodes an 8-bit, non-interlaced RGB or RGBA PNG (what Chromium's screenshots are).
 * Format: PNG specification, 2nd ed. (W3C 2003): chunks §5, IHDR §11.2.2, filters §9 (Paeth predictor §9.4).
 */
export function decodePng(bytes: Uint8Array): Png {
  const buf = Buffer.from(bytes);
  if (!buf.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])))
    throw new Error('not a PNG');
  let width = 0;
  let height = 0;
  let channels = 0;
  const idat: Buffer[] = [];
  for (let at = 8; at < buf.length; ) {
    const length = buf.readUInt32BE(at);
    const type = buf.toString('latin1', at + 4, at + 8);
    const data = buf.subarray(at + 8, at + 8 + length);
    if (type === 'IHDR') {
      width = data.readUInt32BE(0);
      height = data.readUInt32BE(4);
      const [depth, colour, , , interlace] = data.subarray(8, 13);
      if (depth !== 8 || (colour !== 2 && colour !== 6) || interlace !== 0)
        throw new Error(`unsupported PNG (depth ${depth}, colour type ${colour}, interlace ${interlace})`);
      channels = colour === 6 ? 4 : 3;
    } else if (type === 'IDAT') idat.push(data);
    else if (type === 'IEND') break;
    at += 12 + length;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * channels;
  const pixels = new Uint8Array(stride * height);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)];
    const src = y * (stride + 1) + 1;
    const row = y * stride;
    for (let x = 0; x < stride; x++) {
      const a = x >= channels ? pixels[row + x - channels] : 0;
      const b = y > 0 ? pixels[row - stride + x] : 0;
      const c = x >= channels && y > 0 ? pixels[row - stride + x - channels] : 0;
      let predictor = 0;
      if (filter === 1) predictor = a;
      else if (filter === 2) predictor = b;
      else if (filter === 3) predictor = (a + b) >> 1;
      else if (filter === 4) {
        const p = a + b - c;
        const pa = Math.abs(p - a);
        const pb = Math.abs(p - b);
        const pc = Math.abs(p - c);
        predictor = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      }
      pixels[row + x] = (raw[src + x] + predictor) & 0xff;
    }
  }
  return { width, height, channels, pixels };
}

/** How the colours of an image spread: distinct RGB values, and the share of pixels unlike the first one. */
export function colourSpread(png: Png): { distinct: number; differentFromFirst: number } {
  const seen = new Set<number>();
  const { pixels, channels } = png;
  const first = (pixels[0] << 16) | (pixels[1] << 8) | pixels[2];
  let different = 0;
  const n = png.width * png.height;
  for (let i = 0; i < n; i++) {
    const k = i * channels;
    const rgb = (pixels[k] << 16) | (pixels[k + 1] << 8) | pixels[k + 2];
    if (rgb !== first) different++;
    if (seen.size < 100_000) seen.add(rgb);
  }
  return { distinct: seen.size, differentFromFirst: different / n };
}
