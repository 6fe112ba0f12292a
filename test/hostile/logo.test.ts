/**
 * A hostile SVG logo (test/hostile/logo/logo.svg.txt, kept as .txt so the formatter leaves its broken parts alone): a script, event attributes, links to a javascript: and a
 * web address, images pointing at a PNG outside the job's folder, at /etc/passwd, at /dev/zero and at a
 * named pipe, an external <use>, url() paints to the web and to a file, a style sheet with @import, foreign
 * HTML and a self-defined entity. Rendered to every format through the real command line (with a deadline
 * and a small heap, so reading /dev/zero or waiting on the pipe fails the test rather than the machine):
 *   - the PDF, read back by qpdf (uncompressed) and poppler's pdfimages, holds no annotation, no link or
 *     action, no JavaScript and no image at all (the logo is vectors; the outside PNG is not embedded);
 *   - the logo in the HTML, email and JSON is the same safe SVG: none of the payloads survive, and the two
 *     plain shapes and the text do;
 *   - the run takes no input it was not given: the pipe is never opened (a writer would be waiting).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tempDir, temps, writeJob } from '../bad-input/scenario.js';
import { BIN, ROOT } from '../cli/run.js';

const HOSTILE = fileURLToPath(new URL('./logo/logo.svg.txt', import.meta.url));
const SECRET = fileURLToPath(new URL('../render/files-pdf/logo.png', import.meta.url));
const hasTools = ['qpdf', 'pdfimages'].every((t) => spawnSync(t, ['--version']).error === undefined);
const hasMkfifo = spawnSync('mkfifo', ['--version']).status === 0;

let out = '';
let run: { code: number | null; signal: NodeJS.Signals | null; stderr: string };

beforeAll(() => {
  const dir = tempDir('hostile-logo');
  const fifo = join(dir, 'elsewhere', 'pipe.png');
  mkdirSync(join(dir, 'elsewhere'));
  if (hasMkfifo) spawnSync('mkfifo', [fifo]);
  writeFileSync(
    join(dir, 'logo.svg'),
    readFileSync(HOSTILE, 'utf8').replace('SECRET_PNG', SECRET).replace('FIFO_PATH', fifo),
  );
  const job = writeJob(dir, { title: 'Hostile logo', brief: ['  organisation: Test bench', '  logo: logo.svg'] });
  out = join(dir, 'out');
  const r = spawnSync(process.execPath, [BIN, 'render', job, '--out', out, '--format', 'html,pdf,eml,json'], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', NODE_OPTIONS: '--max-old-space-size=512', SOURCE_DATE_EPOCH: '1767225600' },
    encoding: 'utf8',
    timeout: 60_000,
  });
  run = { code: r.status, signal: r.signal, stderr: r.stderr };
}, 90_000);

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

const file = (ext: string): string => join(out, `hostile-logo.${ext}`);

it('renders, without hanging on the pipe or reading /dev/zero', () => {
  expect(run.signal, 'the run hung or was killed').toBeNull();
  expect(run.code, run.stderr).toBe(0);
  expect(readdirSync(out).sort()).toEqual(['html', 'json', 'pdf', 'eml'].map((e) => `hostile-logo.${e}`).sort());
});

describe.skipIf(!hasTools)('the PDF', () => {
  it('has no annotation, link, action or script, and embeds no image', () => {
    const plain = execFileSync('qpdf', ['--qdf', '--object-streams=disable', file('pdf'), '-'], {
      encoding: 'latin1',
      maxBuffer: 256 * 1024 * 1024,
    });
    for (const key of ['/Annots', '/Link', '/URI', '/Launch', '/JavaScript', '/JS ', '/OpenAction', '/AA'])
      expect(plain.includes(key), key).toBe(false);
    expect(plain).not.toContain('javascript:');
    expect(plain).not.toContain('example.invalid');
    // pdfimages -list: two header lines, then one line per image.
    const images = execFileSync('pdfimages', ['-list', file('pdf')], { encoding: 'utf8' })
      .trim()
      .split('\n');
    expect(images.slice(2)).toEqual([]);
  });
});

/** The logo's SVG as the HTML carries it (a data URI in the masthead's img). */
function logoOf(html: string): string {
  const m = /<img class="logo" src="data:image\/svg\+xml;base64,([^"]+)"/.exec(html);
  if (!m) throw new Error('no SVG logo in the HTML');
  // Handlebars escapes the padding "=" of the base64 text as &#x3D;.
  return Buffer.from(m[1].replace(/&#x3D;/g, '='), 'base64').toString('utf8');
}

describe('the logo in the HTML, email and JSON', () => {
  it('keeps the shapes and the text and none of the payloads', () => {
    const svg = logoOf(readFileSync(file('html'), 'utf8'));
    for (const bad of [
      '<script',
      'alert(',
      'javascript:',
      'example.invalid',
      SECRET,
      '/etc/passwd',
      '/dev/zero',
      'pipe.png',
      'other.svg',
      '<use',
      '<a',
      '<image',
      '<style',
      '<foreignObject',
      'iframe',
      'onload',
      'onclick',
      'lollol',
    ])
      expect(svg.includes(bad), bad).toBe(false);
    expect(svg.match(/<rect /g)).toHaveLength(4);
    expect(svg).toContain('fill="#0B6E8C"');
    expect(svg).toContain('>Hostile</text>');
    // The JSON records the same logo, and the email's HTML part shows the same.
    const json = JSON.parse(readFileSync(file('json'), 'utf8'));
    expect(Buffer.from(String(json.meta.logo.dataUri).split(',')[1], 'base64').toString('utf8')).toBe(svg);
    const eml = readFileSync(file('eml'), 'utf8');
    expect(eml).not.toContain('javascript:');
  });
});
