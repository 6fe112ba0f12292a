/**
 * Test helpers: the PDF brief read back by tools that know nothing of how it was made — poppler's
 * pdftotext, pdffonts, pdfinfo and pdftoppm, and qpdf — and a reader for the greyscale PGM images pdftoppm
 * writes (Netpbm: "P5", width, height, maximum value, then one byte per pixel).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

export function run(command: string, args: string[]): string {
  return execFileSync(command, args, { encoding: 'latin1', maxBuffer: 256 * 1024 * 1024 });
}

/** pdftotext as UTF-8 (pages from first to last when given; -layout keeps each table row on one line). */
export function pdfText(file: string, options: { first?: number; last?: number; layout?: boolean } = {}): string {
  const args = ['-enc', 'UTF-8'];
  if (options.first) args.push('-f', String(options.first));
  if (options.last) args.push('-l', String(options.last));
  if (options.layout) args.push('-layout');
  return execFileSync('pdftotext', [...args, file, '-'], { encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
}

/** Runs of white space as one space, as a reader sees wrapped text. */
export function normalise(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

export interface FontRow {
  name: string;
  type: string;
  embedded: boolean;
}

/** pdffonts' table: name, type, encoding, emb, sub, uni, object, generation (the type may hold spaces). */
export function pdfFonts(file: string): FontRow[] {
  const lines = run('pdffonts', [file])
    .split('\n')
    .slice(2)
    .filter((l) => l.trim() !== '');
  return lines.map((line) => {
    const cells = line.trim().split(/\s+/);
    const name = cells[0];
    const [emb] = cells.slice(-5);
    return {
      name,
      type: line
        .slice(name.length)
        .trim()
        .split(/\s{2,}/)[0],
      embedded: emb === 'yes',
    };
  });
}

export function pdfInfo(file: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const line of execFileSync('pdfinfo', ['-enc', 'UTF-8', file], { encoding: 'utf8' }).split('\n')) {
    const i = line.indexOf(':');
    if (i > 0) out[line.slice(0, i).trim()] = line.slice(i + 1).trim();
  }
  return out;
}

export interface WordBox {
  page: number;
  pageWidth: number;
  pageHeight: number;
  xMin: number;
  yMin: number;
  xMax: number;
  yMax: number;
  text: string;
}

/** Every word with its box, from pdftotext -bbox (points, origin at the top left of the page). */
export function wordBoxes(file: string): WordBox[] {
  const html = execFileSync('pdftotext', ['-enc', 'UTF-8', '-bbox', file, '-'], {
    encoding: 'utf8',
    maxBuffer: 256 * 1024 * 1024,
  });
  const words: WordBox[] = [];
  const pages = html.matchAll(/<page width="([\d.]+)" height="([\d.]+)">([\s\S]*?)<\/page>/g);
  let page = 0;
  for (const [, w, h, body] of pages) {
    page++;
    for (const m of body.matchAll(/xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)</g)) {
      words.push({
        page,
        pageWidth: Number(w),
        pageHeight: Number(h),
        xMin: Number(m[1]),
        yMin: Number(m[2]),
        xMax: Number(m[3]),
        yMax: Number(m[4]),
        text: m[5],
      });
    }
  }
  return words;
}

export interface Gray {
  width: number;
  height: number;
  pixels: Uint8Array;
}

/** One page as a greyscale image at dpi, via pdftoppm -gray (a binary PGM). */
export function grayPage(file: string, page: number, dpi: number, dir: string): Gray {
  const prefix = join(dir, `page-${page}-${dpi}`);
  execFileSync('pdftoppm', [
    '-gray',
    '-r',
    String(dpi),
    '-f',
    String(page),
    '-l',
    String(page),
    '-singlefile',
    file,
    prefix,
  ]);
  return readPgm(readFileSync(`${prefix}.pgm`));
}

export function readPgm(bytes: Buffer): Gray {
  // Header: magic, width, height, maxval, separated by white space, then exactly one white-space byte.
  let pos = 0;
  const fields: string[] = [];
  while (fields.length < 4) {
    while (/\s/.test(String.fromCharCode(bytes[pos]))) pos++;
    if (bytes[pos] === 0x23) {
      while (bytes[pos] !== 0x0a) pos++;
      continue;
    }
    let field = '';
    while (!/\s/.test(String.fromCharCode(bytes[pos]))) field += String.fromCharCode(bytes[pos++]);
    fields.push(field);
  }
  if (fields[0] !== 'P5' || fields[3] !== '255') throw new Error(`not an 8-bit binary PGM: ${fields.join(' ')}`);
  const width = Number(fields[1]);
  const height = Number(fields[2]);
  return { width, height, pixels: bytes.subarray(pos + 1, pos + 1 + width * height) };
}

/** Share of pixels darker than near-white inside a box given in points (the page drawn at dpi). */
export function inkShare(img: Gray, dpi: number, box: { x0: number; y0: number; x1: number; y1: number }): number {
  const k = dpi / 72;
  const [x0, y0] = [Math.max(0, Math.floor(box.x0 * k)), Math.max(0, Math.floor(box.y0 * k))];
  const [x1, y1] = [Math.min(img.width, Math.ceil(box.x1 * k)), Math.min(img.height, Math.ceil(box.y1 * k))];
  let ink = 0;
  for (let y = y0; y < y1; y++) for (let x = x0; x < x1; x++) if (img.pixels[y * img.width + x] < 240) ink++;
  return ink / Math.max(1, (x1 - x0) * (y1 - y0));
}

/** The file with its streams uncompressed and one object per block (qpdf's QDF form), as text. */
export function qdf(file: string, dir: string): string {
  const out = join(dir, 'qdf.pdf');
  execFileSync('qpdf', ['--qdf', '--object-streams=disable', file, out]);
  return readFileSync(out, 'latin1');
}

/** The text of every `/Key (literal)` or `/Key <hex>` string in PDF source (UTF-16BE when it starts FE FF). */
export function pdfStrings(source: string, key: string): string[] {
  const out: string[] = [];
  const re = new RegExp(`/${key} (?:\\(((?:\\\\.|[^\\\\)])*)\\)|<([0-9a-fA-F]*)>)`, 'g');
  for (const m of source.matchAll(re)) {
    let bytes: Buffer;
    if (m[2] !== undefined) bytes = Buffer.from(m[2], 'hex');
    else
      bytes = Buffer.from(
        m[1].replace(/\\([nrtbf()\\]|[0-7]{1,3})/g, (_, e: string) =>
          /^[0-7]/.test(e)
            ? String.fromCharCode(Number.parseInt(e, 8))
            : ({ n: '\n', r: '\r', t: '\t', b: '\b', f: '\f' }[e] ?? e),
        ),
        'latin1',
      );
    if (bytes[0] === 0xfe && bytes[1] === 0xff) {
      const swapped = Buffer.from(bytes.subarray(2));
      swapped.swap16();
      out.push(swapped.toString('utf16le'));
    } else out.push(bytes.toString('latin1'));
  }
  return out;
}
