/**
 * examples/harbour-freight end to end, in a child process: rendered to HTML, PDF, JSON and email, every
 * format says the working-day and step statements, the chart marks the named events, the JSON carries the
 * calendar component and observed = trend + seasonal + calendar + remainder holds in it to 1e-9 of the
 * range. The PDF's text is read back with poppler's pdftotext (skipped without it, required in CI).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './run.js';

const hasPoppler = spawnSync('pdftotext', ['-v']).error === undefined;
const required = process.env.CI === 'true';

/** The text of a quoted-printable MIME part, soft line breaks joined and =XX decoded as UTF-8. */
function unquote(qp: string): string {
  const joined = qp.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < joined.length; i++) {
    if (joined[i] === '=' && /^[0-9A-F]{2}$/.test(joined.slice(i + 1, i + 3))) {
      bytes.push(Number.parseInt(joined.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(...Buffer.from(joined[i], 'utf8'));
  }
  return Buffer.from(bytes).toString('utf8');
}

describe('examples/harbour-freight in every format', () => {
  const out = mkdtempSync(join(tmpdir(), 'tb-harbour-'));
  const r = runCli(['render', 'examples/harbour-freight/job.yaml', '--out', out, '--format', 'html,pdf,json,eml'], {
    SOURCE_DATE_EPOCH: '1767225600',
  });

  it('renders every format', () => {
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(out).sort()).toEqual([
      'freight-handled.eml',
      'freight-handled.html',
      'freight-handled.json',
      'freight-handled.pdf',
    ]);
  });

  const brief = () => JSON.parse(readFileSync(join(out, 'freight-handled.json'), 'utf8'));
  const wanted = [
    /October 2026 had 22 working days, one fewer than October 2025\. Allowing for that, the change on a year earlier is a rise of [\d.]+%\./,
    /From March 2024 \(Second container berth opened\) the level stepped up by about [\d,]+ kt\. The trend includes that step\./,
    /Storm closure \(November 2022\): about [\d,]+ kt below the usual pattern\. This one-off is left out of the trend\./,
  ];

  it('the JSON: the statements, the calendar component, and the identity to 1e-9', () => {
    const s = brief().series[0];
    const texts = s.statements.map((x: { text: string }) => x.text).join('\n');
    for (const w of wanted) expect(texts).toMatch(w);
    const c = s.components;
    expect(c.calendar).toHaveLength(c.observed.length);
    const range = Math.max(...c.observed.map(Math.abs));
    for (let i = 0; i < c.observed.length; i++) {
      const sum = c.trend[i] + c.seasonal[i] + c.calendar[i] + c.remainder[i];
      expect(Math.abs(sum - c.observed[i])).toBeLessThanOrEqual(1e-9 * range);
    }
    expect(s.effects.groups).toEqual([expect.objectContaining({ name: 'working days', kept: true })]);
  });

  it('the HTML: the statements, the marks on the chart, the calendar column and the method rows', () => {
    const html = readFileSync(join(out, 'freight-handled.html'), 'utf8').replace(/\s+/g, ' ');
    for (const w of wanted) expect(html).toMatch(w);
    expect(html).toMatch(/<g class="events"/);
    expect(html).toContain('step in level or named event');
    expect(html).toContain('<th scope="col" class="num">Calendar</th>');
    expect(html).toMatch(/Calendar regressors kept.*working days kept \(AICc/);
  });

  it('the email: the statements in the text part', () => {
    const eml = readFileSync(join(out, 'freight-handled.eml'), 'utf8');
    const text = unquote(eml).replace(/\s+/g, ' ');
    for (const w of wanted) expect(text).toMatch(w);
  });

  it.skipIf(!hasPoppler && !required)('the PDF: the statements, read back by pdftotext', () => {
    const text = spawnSync('pdftotext', ['-enc', 'UTF-8', join(out, 'freight-handled.pdf'), '-'], {
      encoding: 'utf8',
    }).stdout.replace(/\s+/g, ' ');
    for (const w of wanted) expect(text).toMatch(w);
    expect(text).toContain('Second container berth opened');
  });
});
