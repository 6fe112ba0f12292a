/**
 * Briefs rendered one after another in one process share the parsed fonts and shaped words. What an earlier
 * brief held must not leak into a later one: here the first brief's first text has a non-breaking hyphen
 * (U+2011), which Source Sans 3 draws with the same glyph as the hyphen-minus, and the later brief must
 * still map that glyph back to "-" for text extraction.
 * This file runs in its own worker, so the shared fonts start empty.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { renderPdf } from '../../src/render/pdf/index.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import { exampleBriefs } from './files-pdf/examples.js';

let dir: string;
let water: Brief;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-process-test-'));
  water = (await exampleBriefs('water-deliveries'))[0];
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('PDF briefs in one process', () => {
  it('do not pass a character mapping from one brief to the next', async () => {
    const odd = { ...water, meta: { ...water.meta, organisation: 'North\u2011East Water' } };
    await renderPdf(odd);
    const after = await renderPdf(water);
    const file = join(dir, 'after.pdf');
    writeFileSync(file, after);
    const text = execFileSync('pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
    expect(text.includes('\u2011')).toBe(false);
    // "year-on-year" and "Low-pass window" keep their plain hyphens.
    expect(text).toContain('Low-pass window');
    // The same brief rendered again gives the same bytes.
    expect((await renderPdf(water)).equals(after)).toBe(true);
  });
});
