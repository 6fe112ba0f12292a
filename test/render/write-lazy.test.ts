/**
 * Files whose bytes are made while they are written (src/render/write.ts: `bytes` as a function, used for
 * the JSON of a long series): made once, hashed as written, and a fault while making them leaves the folder
 * as it was, with no temporary behind and the fault itself reported.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { writeFiles } from '../../src/render/write.js';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-lazy-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('writeFiles with bytes made on demand', () => {
  it('makes them once, writes them in order and reports their size and SHA-256', async () => {
    let calls = 0;
    const pieces = ['{"a":', '[1,2,', '3]}\n'];
    const [w] = await writeFiles([
      {
        path: join(dir, 'x.json'),
        bytes: function* () {
          calls++;
          for (const p of pieces) yield Buffer.from(p);
        },
      },
    ]);
    const text = pieces.join('');
    expect(calls).toBe(1);
    expect(readFileSync(join(dir, 'x.json'), 'utf8')).toBe(text);
    expect(w.size).toBe(text.length);
    expect(w.sha256).toBe(createHash('sha256').update(text).digest('hex'));
  });

  it('keeps the old set and no temporary when making the bytes fails part-way, and reports that fault', async () => {
    writeFileSync(join(dir, 'x.html'), 'old html');
    writeFileSync(join(dir, 'x.json'), 'old json');
    const files = [
      { path: join(dir, 'x.html'), bytes: 'new html' },
      {
        path: join(dir, 'x.json'),
        bytes: function* () {
          yield Buffer.from('{"half":');
          throw new TypeError('no more');
        },
      },
    ];
    await expect(writeFiles(files)).rejects.toThrow(/no more/);
    expect(readdirSync(dir).sort()).toEqual(['x.html', 'x.json']);
    expect(readFileSync(join(dir, 'x.html'), 'utf8')).toBe('old html');
    expect(readFileSync(join(dir, 'x.json'), 'utf8')).toBe('old json');
  });
});
