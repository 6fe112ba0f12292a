/**
 * The write path under random input (seeded, so CI runs the same cases every time):
 *   - file names: for any title, fileStem is the same on every call, at most STEM_BYTES of UTF-8, never
 *     empty, free of path separators, dots and control characters, and never starts or ends with a dash;
 *     two titles that differ in a letter or digit (not only in case, accents or punctuation) get different
 *     names — so a collision is exactly what the batch's check refuses;
 *   - sets of files: writeFiles with one file of a random set unwritable (its folder missing) changes no file
 *     and leaves no temporary; with none unwritable it writes every file with the bytes given;
 *   - partials: a random graph of partials including each other (loops among them) either renders or stops
 *     with the located depth error, never a stack overflow or a crash.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import type { BriefDocument } from '../../src/document/blocks.js';
import { BriefError } from '../../src/errors.js';
import { compileBrief } from '../../src/render/html.js';
import { fileStem, STEM_BYTES, stemKey } from '../../src/render/names.js';
import type { TemplateSource } from '../../src/render/template-source.js';
import { loadTemplates } from '../../src/render/templates.js';
import { writeFiles } from '../../src/render/write.js';

const SEED = 20261203;
const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

/** Titles: any text, and text mixing scripts, accents, punctuation and long runs. */
const title = fc.oneof(
  fc.string({ unit: 'grapheme', maxLength: 300 }),
  fc
    .array(
      fc.constantFrom('São', 'Paulo', 'north', 'North', '東京', 'Київ', '—', '/', ' ', '-', 'A', 'b', '7', 'é', '..'),
      {
        maxLength: 80,
      },
    )
    .map((parts) => parts.join('')),
);

describe('file names', () => {
  it('are stable, short, safe and never empty', () => {
    fc.assert(
      fc.property(title, (t) => {
        const stem = fileStem(t);
        expect(fileStem(t)).toBe(stem);
        expect(stem.length).toBeGreaterThan(0);
        expect(Buffer.byteLength(stem)).toBeLessThanOrEqual(STEM_BYTES);
        expect(stem).not.toMatch(/[/\\.\p{Cc}\s]/u);
        expect(stem).not.toMatch(/^-|-$/);
      }),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('differ when the titles differ in a letter or digit', () => {
    const word = fc.stringMatching(/^[a-z0-9]{1,12}$/);
    fc.assert(
      fc.property(word, word, fc.string({ maxLength: 40 }), (a, b, rest) => {
        fc.pre(a !== b);
        expect(stemKey(fileStem(`${rest} ${a}`))).not.toBe(stemKey(fileStem(`${rest} ${b}`)));
      }),
      { seed: SEED, numRuns: 300 },
    );
  });
});

describe('sets of files', () => {
  it('are written whole or not at all', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.uint8Array({ maxLength: 5000 }), { minLength: 1, maxLength: 5 }),
        fc.option(fc.nat(), { nil: null }),
        async (contents, brokenAt) => {
          const dir = mkdtempSync(join(tmpdir(), 'tb-fuzz-write-'));
          dirs.push(dir);
          const names = contents.map((_, i) => `f${i}.out`);
          for (const n of names) writeFileSync(join(dir, n), `old ${n}`);
          const broken = brokenAt === null ? -1 : brokenAt % contents.length;
          const files = contents.map((bytes, i) => ({
            path: join(dir, i === broken ? 'missing' : '', names[i]),
            bytes: Buffer.from(bytes),
          }));
          const result = await writeFiles(files).catch((e: unknown) => e);
          expect(readdirSync(dir).sort()).toEqual(names.sort());
          for (const [i, n] of names.entries()) {
            const now = readFileSync(join(dir, n));
            if (broken < 0) expect(now.equals(Buffer.from(contents[i]))).toBe(true);
            else expect(now.toString()).toBe(`old ${n}`);
          }
          if (broken >= 0) expect(result).toBeInstanceOf(BriefError);
        },
      ),
      { seed: SEED, numRuns: 60 },
    );
  });
});

describe('partials including each other', () => {
  const view = { sections: [], css: '' } as unknown as BriefDocument;
  const base = loadTemplates(null);
  it('render or stop with the located depth error', () => {
    fc.assert(
      fc.property(
        fc.array(fc.array(fc.nat(4), { maxLength: 3 }), { minLength: 1, maxLength: 5 }),
        fc.boolean(),
        (graph, guarded) => {
          // Partial pN includes the partials its list names; guarded: only inside {{#if nope}}, which is false.
          const partials = new Map(base.partials);
          graph.forEach((calls, i) => {
            const body = calls.map((c) => `{{> p${c % graph.length}}}`).join('<i>,</i>');
            const text = guarded ? `<b>${i}</b>{{#if nope}}${body}{{/if}}` : `<b>${i}</b>${body}`;
            const src: TemplateSource = { name: `p${i}`, file: `/t/partials/p${i}.hbs`, text, override: true };
            partials.set(src.name, src);
          });
          const main: TemplateSource = { name: 'brief', file: '/t/brief.hbs', text: '{{> p0}}', override: true };
          try {
            const html = compileBrief({ ...base, main, partials })(view);
            expect(html).toContain('<b>0</b>');
          } catch (e) {
            expect(e).toBeInstanceOf(BriefError);
            const line = (e as BriefError).oneLine();
            expect(line).toMatch(/^\/t\/partials\/p\d+\.hbs:\d+:\d+: the partial "p\d+" includes itself/);
            expect(guarded).toBe(false);
          }
        },
      ),
      { seed: SEED, numRuns: 200 },
    );
  });
});
