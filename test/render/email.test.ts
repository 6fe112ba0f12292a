/**
 * The .eml brief, read back with an independent MIME parser (mailparser's simpleParser) rather than with
 * anything of ours. The brief is the real one built from examples/online-orders, with a title and a series
 * label full of markup, quotes and an emoji, and carries the real chart PNGs and the real PDF.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { HtmlValidate } from 'html-validate';
import { type ParsedMail, simpleParser } from 'mailparser';
import { beforeAll, describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { chartPng } from '../../src/chart/png.js';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import {
  addressList,
  type EmailOptions,
  emailEnvelope,
  emailImages,
  renderEmail,
  wrap,
} from '../../src/render/email.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import type { Brief } from '../../src/vocabulary/brief.js';
import type { EmailSpec, Job } from '../../src/vocabulary/settings.js';

const TITLE = 'Orders <script>alert("x")</script> & \'quotes\' 📦';
const LABEL = 'Web "shop" <b>orders</b> 🛒';
/** 2026-01-01T00:00:00Z: 20454 days × 86400 s. */
const EPOCH = 1_767_225_600;

let job: Job;
let brief: Brief;
let options: EmailOptions;
let eml: Buffer;
let mail: ParsedMail;

beforeAll(async () => {
  job = loadJob('examples/online-orders/job.yaml');
  job.brief.title = TITLE;
  job.series[0].label = LABEL;
  const [unit] = await buildBriefs(job, { toolVersion: '0.1.0', charts: true, epoch: EPOCH });
  brief = unit.brief as Brief;
  options = {
    pdf: await renderPdf(brief, { archival: true }),
    pdfName: 'orders.pdf',
    pngs: emailImages(brief, chartPng),
    email: job.brief.email,
  };
  eml = await renderEmail(brief, options);
  mail = await simpleParser(eml, { keepCidLinks: true });
});

/** Collapses the plain-text part's line wrapping so a sentence can be found whole. */
const flat = (s: string | undefined) => (s ?? '').replace(/\s+/g, ' ');
const html = () => mail.html || '';

describe('headers', () => {
  test('subject, from and to come from the job file', () => {
    // examples/online-orders/job.yaml, brief.email.
    expect(mail.subject).toBe('Online orders — monthly brief');
    expect(mail.from?.value.map((a) => a.address)).toEqual(['insights@lakeside.example']);
    const to = Array.isArray(mail.to) ? mail.to : [mail.to];
    expect(to.flatMap((t) => t?.value.map((a) => a.address))).toEqual(['trading-leads@lakeside.example']);
  });

  test('Date is the brief’s generatedAt, in the RFC 5322 §3.3 form', () => {
    expect(mail.date?.toISOString()).toBe('2026-01-01T00:00:00.000Z');
    // 1 January 2026 was a Thursday (from memory; Date agrees).
    expect(eml.toString('latin1')).toMatch(/\r\nDate: Thu, 01 Jan 2026 00:00:00 \+0000\r\n/);
  });

  test('without a subject the title and the reporting period are used; overrides win over the job', async () => {
    const email: EmailSpec = { subject: null, from: null, to: [], cc: [] };
    const plain = await simpleParser(await renderEmail(brief, { ...options, email }));
    // The data's last row is 2026-10 (examples/online-orders/data/orders.csv), written "October 2026" in en-US.
    expect(plain.subject).toBe(`${TITLE} — October 2026`);
    const over = await simpleParser(
      await renderEmail(brief, {
        ...options,
        overrides: { subject: 'Weekly pack', to: ['a@x.example', 'b@y.example'] },
      }),
    );
    expect(over.subject).toBe('Weekly pack');
    const to = Array.isArray(over.to) ? over.to : [over.to];
    expect(to.flatMap((t) => t?.value.map((a) => a.address))).toEqual(['a@x.example', 'b@y.example']);
  });

  test('a message with no recipient is still a complete message (a draft), and cannot be sent as it is', async () => {
    const email: EmailSpec = { subject: null, from: null, to: [], cc: [] };
    const raw = await renderEmail(brief, { ...options, email });
    const draft = await simpleParser(raw);
    expect(draft.to).toBeUndefined();
    expect(raw.toString('latin1')).not.toMatch(/\r\nTo:/);
    // RFC 5322 §3.6: Date and From are the only required fields; both are present.
    expect(draft.from?.value[0].address).toMatch(/\.invalid$/);
    expect(draft.date).toBeInstanceOf(Date);
    expect(emailEnvelope(email)).toEqual({ from: null, to: [] });
  });

  test('the envelope holds every To and Cc address', () => {
    const email: EmailSpec = { subject: null, from: 'me@x.example', to: ['a@x.example'], cc: ['c@x.example'] };
    expect(emailEnvelope(email)).toEqual({ from: 'me@x.example', to: ['a@x.example', 'c@x.example'] });
    expect(emailEnvelope(email, { to: ['z@x.example'] })).toEqual({
      from: 'me@x.example',
      to: ['z@x.example', 'c@x.example'],
    });
  });

  test('--to lists are read as RFC 5322 address lists', () => {
    // RFC 5322 §3.4: a comma inside a quoted display name does not separate addresses.
    expect(addressList('a@x.example, "Ops, North" <ops@x.example>', '--to')).toEqual([
      'a@x.example',
      '"Ops, North" <ops@x.example>',
    ]);
    expect(() => addressList('a@x.example,bogus', '--to')).toThrow(/--to has "bogus", which is not an email address/);
    expect(() => addressList(' , ', '--to')).toThrow(/--to names no address/);
  });
});

describe('MIME structure', () => {
  test('mixed ⊃ alternative ⊃ (text, related ⊃ (html, PNGs)), then the PDF', () => {
    // Parts are written depth first, so the Content-Type lines in file order spell out the tree.
    const types = [...eml.toString('latin1').matchAll(/\r\nContent-Type: ([a-z]+\/[a-z0-9.+-]+)/gi)].map((m) => m[1]);
    const charts = brief.series[0].charts.length;
    expect(charts).toBeGreaterThan(0);
    expect(types).toEqual([
      'multipart/mixed',
      'multipart/alternative',
      'text/plain',
      'multipart/related',
      'text/html',
      ...Array(charts).fill('image/png'),
      'application/pdf',
    ]);
  });

  test('every line ends in CRLF and none exceeds 998 octets (RFC 5322 §2.1.1, §2.3)', () => {
    const s = eml.toString('latin1');
    expect(s).not.toMatch(/[^\r]\n/);
    expect(s).not.toMatch(/\r(?!\n)/);
    expect(Math.max(...s.split('\r\n').map((l) => l.length))).toBeLessThanOrEqual(998);
  });

  test('no header names the program or its version', () => {
    const head = eml.toString('latin1').split('\r\n\r\n')[0];
    expect(head).not.toMatch(/X-Mailer|nodemailer|User-Agent/i);
  });
});

describe('plain-text part', () => {
  test('holds the headline statement and every statement, in reading order', () => {
    const text = flat(mail.text);
    // The overview statement is shown only in a brief of several series (tested with the overview).
    const all = brief.series[0].statements.filter((s) => s.kind !== 'overview');
    const headline = all.find((s) => s.kind === 'headline');
    expect(headline).toBeDefined();
    const statements = [headline, ...all.filter((s) => s !== headline)].map((s) => s?.text ?? '');
    let at = -1;
    for (const s of statements) {
      const i = text.indexOf(flat(s));
      expect(i, s).toBeGreaterThan(at);
      at = i;
    }
  });

  test('holds every comparison figure, formatted independently with Intl for en-US', () => {
    const text = flat(mail.text).replace(/\u2212/g, '-');
    const whole = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });
    const pct = new Intl.NumberFormat('en-US', {
      minimumFractionDigits: 1,
      maximumFractionDigits: 1,
      signDisplay: 'exceptZero',
    });
    const comparisons = brief.series[0].analysis.comparisons;
    expect(comparisons.length).toBe(3); // same period last year, year to date, rolling 12 (the job file)
    for (const c of comparisons) {
      expect(text).toContain(c.label);
      for (const v of [c.raw.current, c.raw.baseline]) expect(text).toContain(whole.format(v));
      for (const v of [c.raw.percent, c.adjusted.percent, c.trend.percent]) expect(text).toContain(`${pct.format(v)}%`);
    }
  });

  test('holds the cautions and names the attached PDF; user text reads as written', () => {
    const text = flat(mail.text);
    for (const c of brief.cautions) expect(text).toContain(c.text);
    expect(text).toContain('orders.pdf');
    expect(mail.text).toContain(TITLE);
    expect(text).toContain(LABEL);
    expect(mail.text).not.toContain('&lt;');
  });

  test('lines wrap at 72 characters except a single word longer than that', () => {
    for (const line of (mail.text ?? '').split('\n')) {
      if ([...line].length > 72) expect(line.trim()).not.toContain(' ');
    }
    // Worked example: "aaa bbb ccc" at width 7 → "aaa bbb" (7 characters) then "  ccc" with the hanging indent.
    expect(wrap('aaa bbb ccc', '  ', 7)).toBe('aaa bbb\n  ccc');
  });
});

describe('HTML part', () => {
  test('escapes markup and quotes in user text, keeps the emoji', () => {
    const h = html();
    expect(h).not.toMatch(/<script/i);
    expect(h).not.toContain('<b>orders</b>');
    // Handlebars' escaping (handlebarsjs.com, "HTML escaping"): & < > " ' ` = become entities.
    expect(h).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &#x27;quotes&#x27; 📦');
    expect(h).toContain('Web &quot;shop&quot; &lt;b&gt;orders&lt;/b&gt; 🛒');
  });

  test('is email-safe: inline styles only, no classes or style sheets, at most 640 px wide', () => {
    const h = html();
    expect(h).not.toMatch(/<style|<link|\sclass=|<script/i);
    for (const m of h.matchAll(/\swidth="(\d+)"/g)) expect(Number(m[1])).toBeLessThanOrEqual(640);
    for (const m of h.matchAll(/max-width:(\d+)px/g)) expect(Number(m[1])).toBeLessThanOrEqual(640);
    for (const m of h.matchAll(/[\s;"]width:(\d+)px/g)) expect(Number(m[1])).toBeLessThanOrEqual(640);
  });

  test('is valid HTML apart from the table attributes and inline styles email clients need', async () => {
    const validator = new HtmlValidate({
      extends: ['html-validate:recommended'],
      rules: { 'no-inline-style': 'off', 'no-deprecated-attr': 'off' },
    });
    const report = await validator.validateString(html());
    expect(
      report.results.flatMap((r) => r.messages.map((m) => `${m.line}:${m.column} ${m.ruleId} ${m.message}`)),
    ).toEqual([]);
  });

  test('shows each chart as a cid: image with alt text and a size that keeps the PNG’s shape', () => {
    const h = html();
    const imgs = [...h.matchAll(/<img\b[^>]*>/g)].map((m) => m[0]);
    const charts = brief.series[0].charts;
    expect(imgs.length).toBe(charts.length);
    for (const [i, chart] of charts.entries()) {
      const img = imgs[i];
      const cid = /src="cid:([^"]+)"/.exec(img)?.[1];
      expect(cid).toBeDefined();
      const escapedAlt = chart.alt
        .replace(/&/g, '&amp;')
        .replace(/"/g, '&quot;')
        .replace(/'/g, '&#x27;')
        .replace(/</g, '&lt;')
        .replace(/>/g, '&gt;')
        .replace(/=/g, '&#x3D;');
      expect(img).toContain(`alt="${escapedAlt}"`);
      const part = mail.attachments.find((a) => a.cid === cid);
      expect(part, cid).toBeDefined();
      expect(part?.contentType).toBe('image/png');
      expect(part?.contentId).toBe(`<${cid}>`);
      // PNG signature, ISO/IEC 15948 §5.2; the IHDR width and height are big-endian at bytes 16 and 20.
      const png = part?.content as Buffer;
      expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      const [pw, ph] = [png.readUInt32BE(16), png.readUInt32BE(20)];
      const w = Number(/\swidth="(\d+)"/.exec(img)?.[1]);
      const hgt = Number(/\sheight="(\d+)"/.exec(img)?.[1]);
      expect(w).toBeGreaterThan(0);
      expect(w).toBeLessThanOrEqual(640);
      expect(Math.abs(hgt - (w * ph) / pw)).toBeLessThanOrEqual(1); // rounding to whole pixels
    }
  });
});

describe('PDF attachment', () => {
  test('is attached as application/pdf under its file name and is the PDF given', () => {
    const pdfs = mail.attachments.filter((a) => a.contentType === 'application/pdf');
    expect(pdfs.length).toBe(1);
    expect(pdfs[0].filename).toBe('orders.pdf');
    expect(pdfs[0].contentDisposition).toBe('attachment');
    // ISO 32000-1 §7.5.2: a PDF file begins with "%PDF-".
    expect(pdfs[0].content.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdfs[0].content.equals(options.pdf)).toBe(true);
  });
});

describe('template overrides', () => {
  test('an email.txt.hbs in the job’s templates folder replaces the built-in one; the HTML stays', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-email-'));
    writeFileSync(join(dir, 'email.txt.hbs'), 'Brief: {{title}}\n');
    const parsed = await simpleParser(await renderEmail(brief, { ...options, templates: dir }), { keepCidLinks: true });
    expect(parsed.text?.trim()).toBe(`Brief: ${TITLE}`);
    expect(parsed.html === mail.html).toBe(true);
  });

  test('a broken override is one line naming the file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-email-'));
    writeFileSync(join(dir, 'email.hbs'), '<p>{{#if title}}unclosed</p>\n');
    const run = renderEmail(brief, { ...options, templates: dir });
    await expect(run).rejects.toBeInstanceOf(BriefError);
    const e = (await run.catch((x: unknown) => x)) as BriefError;
    const line = e.oneLine();
    expect(line.startsWith(`${join(dir, 'email.hbs')}: the email template does not work: `)).toBe(true);
    expect(line).not.toContain('\n');
  });
});

describe('determinism', () => {
  test('two renders of the same brief, with the PNGs drawn again, give the same bytes', async () => {
    const again = await renderEmail(brief, { ...options, pngs: emailImages(brief, chartPng) });
    expect(again.equals(eml)).toBe(true);
  });

  test('Message-ID and boundaries follow the content: a different PDF changes them', async () => {
    const other = await renderEmail(brief, { ...options, pdf: Buffer.concat([options.pdf, Buffer.from('%\n')]) });
    const id = (b: Buffer) => /\r\nMessage-ID: (<[^>]+>)/.exec(b.toString('latin1'))?.[1];
    const boundary = (b: Buffer) => /boundary="([^"]+)"/.exec(b.toString('latin1'))?.[1];
    expect(id(eml)).toMatch(/^<[0-9a-f]{16}@trendbrief\.invalid>$/);
    expect(id(other)).not.toBe(id(eml));
    expect(boundary(other)).not.toBe(boundary(eml));
  });
});
