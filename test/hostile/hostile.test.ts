/**
 * Hostile text in every field a reader sees (test/hostile/job/job.yaml: title, organisation, author,
 * contact, series label and unit, comparison labels, email subject, and a group name from the data file):
 * markup that would run script if it were pasted in unescaped, quotes, a literal "&amp;", Hebrew and
 * Arabic, emoji. Rendered once through the real command line, every output must keep it inert and readable:
 *   - HTML (read back by htmlparser2, a tolerant HTML parser): no script element, no on… attribute, no
 *     element the payloads would create; the payloads' raw markup never appears; their text does;
 *   - each chart SVG (read by the XML checker of test/chart/xml.ts): no script, no on… attribute, the
 *     labels as text;
 *   - PDF (read back by poppler's pdftotext and qpdf): the text literally, no script or link actions;
 *   - email (read back by mailparser): the subject and the text part literally, the HTML part escaped;
 *   - JSON: every string exactly as written in the job.
 * "Inert" follows the HTML Standard's parsing rules (WHATWG): text escaped as &lt; never opens a tag.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Node as DomNode, Element } from 'domhandler';
import { parseDocument as parseHtml } from 'htmlparser2';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse as parseYaml } from 'yaml';
import { parseXml, type XmlElement, type XmlNode } from '../chart/xml.js';
import { runCli } from '../cli/run.js';
import { normalise, pdfFonts, pdfText } from '../render/files-pdf/poppler.js';

const JOB = fileURLToPath(new URL('./job/job.yaml', import.meta.url));
const DATA = fileURLToPath(new URL('./job/data/values.csv', import.meta.url));

interface HostileJob {
  brief: { title: string; organisation: string; author: string; contact: string; email: { subject: string } };
  series: { label: string; unit: string }[];
  comparisons: (string | Record<string, { label: string }>)[];
}

const job = parseYaml(readFileSync(JOB, 'utf8')) as HostileJob;
const group = readFileSync(DATA, 'utf8').split('\n')[1].split(',')[1];
const title = `${job.brief.title} — ${group}`;
const label = job.series[0].label;
const unit = job.series[0].unit;
const comparisonLabels = job.comparisons.flatMap((c) =>
  typeof c === 'string' ? [] : Object.values(c).map((v) => v.label),
);

/** Every text a reader should see, as written. */
const TEXTS = [
  job.brief.title,
  group,
  job.brief.organisation,
  job.brief.author,
  job.brief.contact,
  label,
  unit,
  ...comparisonLabels,
];
/** The email leaves out the contact line (templates/email.hbs); the rest it shows. */
const EMAIL_TEXTS = TEXTS.filter((t) => t !== job.brief.contact);
/** The markup in them that a renderer pasting text in unescaped would turn into elements. */
const RAW_MARKUP = ['<script>', '<img src=x', '<img src=y', '<svg onload', '<b onclick', '<i onmouseover', '<b>x</b>'];
/** The elements those would create. */
const PAYLOAD_ELEMENTS = ['script', 'img', 'b', 'i'];

let out: string;
const file = (ext: string): string => {
  const name = readdirSync(out).find((f) => f.endsWith(`.${ext}`));
  if (!name) throw new Error(`no .${ext} written`);
  return join(out, name);
};

beforeAll(() => {
  out = mkdtempSync(join(tmpdir(), 'tb-hostile-'));
  const r = runCli(['render', JOB, '--out', out, '--format', 'html,pdf,eml,json'], { SOURCE_DATE_EPOCH: '1767225600' });
  expect(r.code, r.stderr).toBe(0);
}, 180_000);

afterAll(() => rmSync(out, { recursive: true, force: true }));

it('the fixture carries each kind of hostile text', () => {
  const all = TEXTS.join(' ');
  for (const kind of ['<script>', 'onerror=', 'onload=', '"', "'", '&amp;', 'שלום', 'مياه', '💧'])
    expect(all).toContain(kind);
  expect(comparisonLabels).toHaveLength(2);
});

// ---- HTML ---------------------------------------------------------------------------------------------

function elements(nodes: DomNode[]): Element[] {
  const found: Element[] = [];
  const walk = (list: DomNode[]): void => {
    for (const n of list) {
      if ('attribs' in n) {
        found.push(n as Element);
        walk((n as Element).children);
      }
    }
  };
  walk(nodes);
  return found;
}

function textOf(nodes: DomNode[]): string {
  let text = '';
  for (const n of nodes) {
    if (n.type === 'text') text += (n as unknown as { data: string }).data;
    else if ('children' in n) text += textOf((n as Element).children);
  }
  return text;
}

/** The HTML checks shared by the page and the email's HTML part. */
function expectInertHtml(html: string): { els: Element[]; text: string } {
  for (const raw of RAW_MARKUP) expect(html, raw).not.toContain(raw);
  const doc = parseHtml(html);
  const els = elements(doc.children);
  expect(els.length).toBeGreaterThan(50);
  for (const el of els) {
    // The email's charts are images (inline PNG parts); any other image would come from user text.
    const chartImage = el.name === 'img' && /^(data:image\/png;base64,|cid:)/.test(el.attribs.src ?? '');
    if (!chartImage) expect(PAYLOAD_ELEMENTS, `<${el.name}> element`).not.toContain(el.name);
    for (const name of Object.keys(el.attribs)) expect(name, `${name} on <${el.name}>`).not.toMatch(/^on/i);
    for (const v of Object.values(el.attribs)) expect(v).not.toMatch(/^\s*javascript:/i);
  }
  return { els, text: normalise(textOf(doc.children)) };
}

describe('HTML', () => {
  it('creates no element and no attribute from user text, and shows every text literally', () => {
    const html = readFileSync(file('html'), 'utf8');
    const { els, text } = expectInertHtml(html);
    const h1 = els.find((e) => e.name === 'h1');
    expect(h1 && textOf(h1.children)).toBe(title);
    expect(textOf(els.find((e) => e.name === 'title')?.children ?? [])).toContain(title);
    for (const t of TEXTS) expect(text, t).toContain(normalise(t));
  });
});

// ---- SVG ----------------------------------------------------------------------------------------------

function xmlElements(root: XmlElement): XmlElement[] {
  const all: XmlElement[] = [root];
  for (const c of root.children) if (typeof c !== 'string') all.push(...xmlElements(c));
  return all;
}

function xmlText(nodes: XmlNode[]): string {
  return nodes.map((n) => (typeof n === 'string' ? n : xmlText(n.children))).join('');
}

describe('SVG charts', () => {
  it('each chart is well-formed, has no script or on… attribute, and names the series in its title', () => {
    const html = readFileSync(file('html'), 'utf8');
    const svgs = html.match(/<svg\b[\s\S]*?<\/svg>/g) ?? [];
    expect(svgs.length).toBe(6);
    const texts: string[] = [];
    for (const svg of svgs) {
      const root = parseXml(svg);
      expect(root.name).toBe('svg');
      for (const el of xmlElements(root)) {
        expect(['script', 'foreignObject']).not.toContain(el.name);
        for (const name of Object.keys(el.attrs)) expect(name).not.toMatch(/^on/i);
      }
      const chartTitle = xmlText(xmlElements(root).find((e) => e.name === 'title')?.children ?? []);
      expect(chartTitle.startsWith(`${label}: `)).toBe(true);
      texts.push(xmlText(root.children));
    }
    const all = texts.join('\n');
    expect(all).toContain(unit);
    for (const c of comparisonLabels) expect(all).toContain(c);
  });
});

// ---- PDF ----------------------------------------------------------------------------------------------

/**
 * The text without Hebrew, Arabic and emoji, without white space, and without the directional embedding
 * controls pdftotext puts around right-to-left words (U+202A–U+202E, U+2066–U+2069, U+200E/F). Where a
 * right-to-left word meets neutral characters ("<", "("), pdftotext, reading the page in visual order, may
 * put the neutrals on either side of the word, so the order is compared without the word; the words
 * themselves are checked in logical order below.
 */
function latinPart(text: string): string {
  return text.replace(/[\u0590-\u06ff]|\p{Extended_Pictographic}|[\u200e\u200f\u202a-\u202e\u2066-\u2069]|\s/gu, '');
}

describe('PDF', () => {
  it('shows the markup, quotes and "&amp;" literally, as text', () => {
    const text = latinPart(pdfText(file('pdf')));
    for (const t of TEXTS) expect(text, t).toContain(latinPart(t));
  });

  it('holds no script, launch or link action', () => {
    // qpdf --qdf writes every object uncompressed, so the dictionaries can be searched as text.
    const qdf = execFileSync('qpdf', ['--qdf', '--object-streams=disable', file('pdf'), '-'], {
      maxBuffer: 64 * 1024 * 1024,
    }).toString('latin1');
    expect(qdf).toContain('/Type /Page');
    for (const key of ['/JavaScript', '/JS ', '/Launch', '/OpenAction', '/AA ', '/URI']) expect(qdf).not.toContain(key);
  });

  // Source Sans 3 has no Hebrew or Arabic glyphs; the PDF sets them in Noto Sans Hebrew and Arabic, in
  // visual order, and pdftotext (poppler) gives them back in logical order.
  it('shows Hebrew and Arabic text', () => {
    const text = normalise(pdfText(file('pdf')));
    for (const word of ['שלום', 'مياه', 'מים']) expect(text).toContain(word);
  });

  // The emoji are set in an outline emoji font (a subset of Symbola), never as a missing glyph.
  it('shows the emoji as text, in an embedded font', () => {
    const text = pdfText(file('pdf'));
    for (const emoji of ['💧', '🌧']) expect(text).toContain(emoji);
    const fonts = pdfFonts(file('pdf'));
    expect(fonts.some((f) => f.name.endsWith('+Symbola') && f.embedded)).toBe(true);
    expect(fonts.every((f) => f.embedded)).toBe(true);
  });
});

// ---- Email --------------------------------------------------------------------------------------------

describe('email', () => {
  it('has the subject and, in the text part, every text literally; the HTML part is escaped', async () => {
    const mail = await simpleParser(readFileSync(file('eml')));
    expect(mail.subject).toBe(job.brief.email.subject);
    const text = normalise(mail.text ?? '');
    for (const t of EMAIL_TEXTS) expect(text, t).toContain(normalise(t));
    expect(typeof mail.html).toBe('string');
    const { text: htmlText } = expectInertHtml(mail.html as string);
    for (const t of EMAIL_TEXTS) expect(htmlText, t).toContain(normalise(t));
    expect(mail.attachments.some((a) => a.contentType === 'application/pdf')).toBe(true);
  });
});

// ---- JSON ---------------------------------------------------------------------------------------------

describe('JSON', () => {
  it('keeps every string exactly as written', () => {
    const brief = JSON.parse(readFileSync(file('json'), 'utf8'));
    expect(brief.meta.title).toBe(title);
    expect(brief.meta.organisation).toBe(job.brief.organisation);
    expect(brief.meta.author).toBe(job.brief.author);
    expect(brief.meta.contact).toBe(job.brief.contact);
    expect(brief.series[0].label).toBe(label);
    expect(brief.series[0].unit).toBe(unit);
    expect(brief.series[0].group).toBe(group);
    const labels = brief.series[0].analysis.comparisons.map((c: { label: string }) => c.label);
    for (const c of comparisonLabels) expect(labels).toContain(c);
  });
});

// ---- Email headers ------------------------------------------------------------------------------------

describe('email headers', () => {
  it('a line break in the subject, title or label adds no header and ends no header block', async () => {
    const job2 = fileURLToPath(new URL('./newlines/job.yaml', import.meta.url));
    const dir = mkdtempSync(join(tmpdir(), 'tb-hostile-headers-'));
    try {
      const r = runCli(['render', job2, '--out', dir, '--format', 'eml'], { SOURCE_DATE_EPOCH: '1767225600' });
      expect(r.code, r.stderr).toBe(0);
      const eml = readFileSync(join(dir, readdirSync(dir)[0]));
      // The header block ends at the first empty line (RFC 5322 §2.1); nothing injected may sit in it.
      const head = eml.toString('latin1').split('\r\n\r\n')[0];
      expect(head).not.toMatch(/^(Bcc|X-Injected):/im);
      const mail = await simpleParser(eml);
      expect(mail.headers.has('bcc')).toBe(false);
      expect(mail.headers.has('x-injected')).toBe(false);
      expect(mail.subject).not.toMatch(/[\r\n]/);
      expect(normalise(mail.subject ?? '')).toBe('Subject Bcc: subject-injected@example.org A body of its own');
      expect(mail.to && 'text' in mail.to ? mail.to.text : '').toBe('someone@example.org');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
