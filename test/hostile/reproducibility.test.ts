/**
 * Reproducibility, through the real command line, for every example job (examples/<name>/job.yaml):
 *   - with SOURCE_DATE_EPOCH set (reproducible-builds.org), two runs write byte-identical HTML, PDF, email
 *     and JSON (DEVELOPERS.md: "every output is byte-identical across runs");
 *   - without it, the only difference is the generation time: the JSON files agree once
 *     provenance.generatedAt is removed, and the HTML files agree once each <time datetime="T">…</time>
 *     element whose T is that run's generatedAt (the "Generated" lines of the masthead and the method
 *     appendix) is replaced by the same placeholder. The PDF and the email also carry the time (the PDF's
 *     dates, the message's Date header and the attached PDF), so they are compared only with the epoch set.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT, runCli } from '../cli/run.js';

const EXAMPLES = readdirSync(join(ROOT, 'examples'), { withFileTypes: true })
  .filter((d) => d.isDirectory() && readdirSync(join(ROOT, 'examples', d.name)).includes('job.yaml'))
  .map((d) => d.name)
  .sort();

const temps: string[] = [];
afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

function render(example: string, formats: string, env: Record<string, string>): Map<string, Buffer> {
  const out = mkdtempSync(join(tmpdir(), `tb-repro-${example}-`));
  temps.push(out);
  const r = runCli(['render', `examples/${example}/job.yaml`, '--out', out, '--format', formats], env);
  expect(r.code, r.stderr).toBe(0);
  return new Map(readdirSync(out).map((f) => [f, readFileSync(join(out, f))]));
}

/** The HTML with the run's generation time, wherever it is shown as a <time> element, made a placeholder. */
function withoutTime(html: string, generatedAt: string): { text: string; replaced: number } {
  let replaced = 0;
  const escaped = generatedAt.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const text = html.replace(new RegExp(`<time datetime="${escaped}">[^<]*</time>`, 'g'), () => {
    replaced++;
    return '<time>GENERATED</time>';
  });
  return { text, replaced };
}

describe('reproducible output', () => {
  it('finds the examples', () => {
    expect(EXAMPLES.length).toBeGreaterThanOrEqual(3);
  });

  for (const example of EXAMPLES) {
    it(`${example}: with SOURCE_DATE_EPOCH, two runs write the same bytes in every format`, () => {
      const env = { SOURCE_DATE_EPOCH: '1767225600' };
      const a = render(example, 'html,pdf,eml,json', env);
      const b = render(example, 'html,pdf,eml,json', env);
      expect([...a.keys()].sort()).toEqual([...b.keys()].sort());
      for (const ext of ['html', 'pdf', 'eml', 'json'])
        expect([...a.keys()].some((f) => f.endsWith(`.${ext}`))).toBe(true);
      for (const [name, bytes] of a) expect(bytes.equals(b.get(name) as Buffer), name).toBe(true);
    }, 300_000);

    it(`${example}: without it, only the generation time differs in the JSON and the HTML`, () => {
      const env = { SOURCE_DATE_EPOCH: '' };
      const a = render(example, 'html,json', env);
      const b = render(example, 'html,json', env);
      for (const [name, bytes] of a) {
        if (!name.endsWith('.json')) continue;
        const ja = JSON.parse(bytes.toString('utf8'));
        const jb = JSON.parse((b.get(name) as Buffer).toString('utf8'));
        const [ta, tb] = [ja.provenance.generatedAt, jb.provenance.generatedAt];
        // The runs are seconds apart, so the millisecond times differ: the comparison below is not idle.
        expect(ta).not.toBe(tb);
        delete ja.provenance.generatedAt;
        delete jb.provenance.generatedAt;
        expect(ja, name).toEqual(jb);

        const html = name.replace(/\.json$/, '.html');
        const ha = withoutTime((a.get(html) as Buffer).toString('utf8'), ta);
        const hb = withoutTime((b.get(html) as Buffer).toString('utf8'), tb);
        // The masthead and the method appendix each show the time once.
        expect(ha.replaced).toBe(2);
        expect(hb.replaced).toBe(2);
        expect(ha.text === hb.text, html).toBe(true);
      }
    }, 300_000);
  }
});
