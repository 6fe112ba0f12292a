/**
 * The brief as an email message (.eml): RFC 5322 headers over a MIME tree (RFC 2045–2049) —
 *
 *   multipart/mixed
 *   ├─ multipart/alternative
 *   │  ├─ text/plain          statements in reading order, key figures, comparisons, cautions
 *   │  └─ multipart/related   (RFC 2387)
 *   │     ├─ text/html        single column, tables, inline styles only, at most 600 px wide
 *   │     └─ image/png …      the charts, referenced from the HTML as cid: URLs (RFC 2392)
 *   └─ application/pdf       the full brief
 *
 * composed by nodemailer's MailComposer. Both text parts walk the brief's document (src/document/), the same
 * blocks as the HTML and PDF briefs, in the same order; the appendices are named with a pointer to the
 * attached PDF instead of being repeated. The bytes depend on the Brief and the attachments alone: Date is
 * the brief's generatedAt, Message-ID and the MIME boundaries are cut from a SHA-256 of the content, and
 * line breaks are CRLF throughout, so two renders of the same Brief give the same file.
 */
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import MailComposer, { type MailComposerOptions } from 'nodemailer/lib/mail-composer';
import type { Block, BriefDocument, SectionBlock, Table } from '../document/blocks.js';
import { buildDocument } from '../document/build.js';
import { type BriefView, briefView } from '../document/view.js';
import { WORDS } from '../document/words.js';
import { BriefError, withCause } from '../errors.js';
import { isAddress, splitAddressList } from '../job/address.js';
import { NotRegularFile, readRegularFile } from '../read-file.js';
import type { Brief, Chart } from '../vocabulary/brief.js';
import type { EmailSpec } from '../vocabulary/settings.js';
import { isolatedHandlebars } from './handlebars.js';
import { notOrdinary } from './templates.js';

/** A chart's PNG with the Content-ID the HTML part refers to. */
export interface EmailImage {
  cid: string;
  chart: Chart;
  png: Buffer;
}

/** Header settings given on the command line; each one present replaces the job's. */
export interface EmailOverrides {
  subject?: string;
  from?: string;
  to?: string[];
  cc?: string[];
}

export interface EmailOptions {
  pdf: Buffer;
  /** File name of the PDF attachment, e.g. "online-orders.pdf". */
  pdfName: string;
  pngs: EmailImage[];
  email: EmailSpec;
  overrides?: EmailOverrides;
  /** Folder of template overrides (the job's brief.templates): email.hbs and email.txt.hbs there win. */
  templates?: string | null;
  /** The brief's document, when the caller has it already. */
  document?: BriefDocument;
}

export interface EmailHeaders {
  subject: string;
  from: string;
  to: string[];
  cc: string[];
  /** True when the job names no sender: From is then the placeholder below and the message cannot be sent. */
  placeholderFrom: boolean;
}

/** `.invalid` is reserved and never resolves (RFC 2606 §2), so nothing is ever delivered to or from it. */
export const ID_DOMAIN = 'trendbrief.invalid';
export const PLACEHOLDER_FROM = `brief@${ID_DOMAIN}`;

/** Widest the HTML part gets; images are scaled down to fit inside its padding. */
const WIDTH = 600;
const PAD = 16;
/** Plain-text lines are wrapped here, within the 78 characters RFC 5322 §2.1.1 recommends. */
const TEXT_WIDTH = 72;

/**
 * Subject, From, To and Cc: the overrides, else the job's email settings. The subject defaults to the
 * title and the reporting period. RFC 5322 §3.6 requires only Date and From, so a message with no To and
 * no Cc is still a valid message — a draft to forward by hand. A job with no sender gets the placeholder
 * address, which keeps the message valid but cannot be sent (see emailEnvelope).
 */
export function emailHeaders(brief: Brief, email: EmailSpec, overrides: EmailOverrides = {}): EmailHeaders {
  const from = overrides.from ?? email.from;
  return {
    subject: overrides.subject ?? email.subject ?? defaultSubject(briefView(brief)),
    from: from ?? PLACEHOLDER_FROM,
    to: overrides.to ?? email.to,
    cc: overrides.cc ?? email.cc,
    placeholderFrom: from === null || from === undefined,
  };
}

/** The SMTP envelope of the message: its sender (null for the placeholder) and every To and Cc address. */
export function emailEnvelope(email: EmailSpec, overrides: EmailOverrides = {}): { from: string | null; to: string[] } {
  return {
    from: overrides.from ?? email.from ?? null,
    to: [...(overrides.to ?? email.to), ...(overrides.cc ?? email.cc)],
  };
}

/**
 * A comma-separated address list as typed on the command line (`a@x.example, "Ops, North" <ops@x.example>`),
 * cut at the commas outside quotes, each entry held to the same rule as the job file's addresses
 * (job/address.ts): `'a@x b@x'`, `'a@x:evil@y'` or an entry holding a line break is refused, never
 * reinterpreted as another recipient or header.
 */
export function addressList(text: string, option: string): string[] {
  const out = splitAddressList(text);
  for (const entry of out) {
    if (!isAddress(entry)) {
      throw new BriefError(
        'usage',
        `${option} has "${entry}", which is not an email address`,
        `write addresses like ${option} a@example.org,"Name" <b@example.org>, separated by commas`,
      );
    }
  }
  if (out.length === 0)
    throw new BriefError('usage', `${option} names no address`, `write e.g. ${option} a@example.org`);
  return out;
}

/**
 * One Content-ID per chart the document shows (the series' figures and the overview's sparklines), numbered
 * in reading order, with the chart's id (a plain word; anything else becomes a dash, keeping the id inside
 * the dot-atom syntax RFC 5322 §3.6.4 gives message ids).
 */
export function emailImages(brief: Brief, toPng: (chart: Chart) => Buffer, document?: BriefDocument): EmailImage[] {
  const safe = (s: string) => s.replace(/[^A-Za-z0-9-]+/g, '-').replace(/^-+|-+$/g, '') || 'x';
  const charts: { chart: Chart; owner: string }[] = [];
  const walk = (blocks: Block[], owner: string): void => {
    for (const b of blocks) {
      if (b.kind === 'section') walk(b.blocks, b.id ?? owner);
      else if (b.kind === 'figures') for (const chart of b.charts) charts.push({ chart, owner });
      else if (b.kind === 'overview')
        for (const r of b.rows) if (r.spark) charts.push({ chart: r.spark, owner: r.target });
    }
  };
  const doc = document ?? buildDocument(brief, briefView(brief));
  for (const section of doc.sections) if (!section.detail) walk([section], 'brief');
  return charts.map(({ chart, owner }, i) => ({
    cid: `${i + 1}.${safe(owner)}.${safe(chart.id)}@${ID_DOMAIN}`,
    chart,
    png: toPng(chart),
  }));
}

export async function renderEmail(brief: Brief, options: EmailOptions): Promise<Buffer> {
  const view = briefView(brief);
  const document = options.document ?? buildDocument(brief, view);
  const headers = emailHeaders(brief, options.email, options.overrides);
  const images = new Map(options.pngs.map((p) => [p.chart, p]));
  const model = emailModel(view, document, headers.subject, options.pdfName, images);
  const { html, text } = templates(options.templates ?? null);
  const textPart = crlf(text(model.text));
  const htmlPart = crlf(html(model.html));

  const digest = createHash('sha256');
  for (const part of [JSON.stringify(headers), brief.provenance.generatedAt, textPart, htmlPart])
    digest.update(part).update('\0');
  for (const p of options.pngs) digest.update(p.cid).update(p.png);
  digest.update(options.pdfName).update(options.pdf);
  const hex = digest.digest('hex');

  const mail: MailComposerOptions = {
    from: headers.from,
    to: headers.to.length > 0 ? headers.to : undefined,
    cc: headers.cc.length > 0 ? headers.cc : undefined,
    subject: headers.subject,
    date: new Date(brief.provenance.generatedAt),
    // Derived from the content, so it repeats when the same brief is rendered again: that is the point.
    messageId: `<${hex.slice(0, 16)}@${ID_DOMAIN}>`,
    text: { content: textPart, contentType: 'text/plain; charset=utf-8' },
    html: { content: htmlPart, contentType: 'text/html; charset=utf-8' },
    attachments: [
      ...options.pngs.map((p) => ({
        cid: p.cid,
        filename: `${p.chart.id}.png`,
        content: p.png,
        contentType: 'image/png',
        contentDisposition: 'inline',
      })),
      {
        filename: options.pdfName,
        content: options.pdf,
        contentType: 'application/pdf',
        contentDisposition: 'attachment',
      },
    ],
    // MimeNode draws a random boundary base unless given one; a slice of the digest makes it repeatable.
    boundaryPrefix: '--_tb',
    baseBoundary: hex.slice(16, 32),
    newline: 'win',
    disableFileAccess: true,
    disableUrlAccess: true,
  };
  return new MailComposer(mail).compile().build();
}

interface Models {
  html: Record<string, unknown>;
  text: Record<string, unknown>;
}

/**
 * The two parts' models: the document's sections, each a flat list of blocks in reading order (a series'
 * subsections inline), laid out for a 600 px column and for 72-character lines. The masthead and contents
 * become the message's own head; an appendix becomes its heading and a pointer to the attached PDF.
 */
function emailModel(
  view: BriefView,
  document: BriefDocument,
  subject: string,
  pdfName: string,
  images: Map<Chart, EmailImage>,
): Models {
  const periods = [...new Set(view.series.map((s) => s.reportingPeriod))];
  const attachmentLine = WORDS.attached(pdfName);
  const footerLine = WORDS.footer(view.generatedAt, view.toolVersion, view.jobFile, view.fingerprint);
  const common = {
    lang: document.lang,
    subject,
    title: document.title,
    organisation: [view.organisation, view.author].filter(Boolean).join(' · '),
    periodLine: WORDS.reportingPeriods(periods),
    attachmentLine,
    footerLine,
  };
  const inner = WIDTH - 2 * PAD;
  const body = document.sections.filter((x) => x.name !== 'masthead' && x.name !== 'contents');
  const image = (chart: Chart) => {
    const found = images.get(chart);
    if (!found) return null;
    const width = Math.min(chart.width, inner);
    return {
      cid: found.cid,
      title: chart.title,
      alt: chart.alt,
      caption: chart.caption,
      width,
      height: Math.round((chart.height * width) / chart.width),
    };
  };
  const html = {
    ...common,
    width: WIDTH,
    pad: PAD,
    accent: document.accent,
    preheader: view.series[0]?.headline?.text ?? '',
    sections: body.map((section) => ({
      blocks: section.detail ? detail(section, pdfName) : flat(section.blocks).flatMap((b) => htmlBlock(b, image)),
    })),
  };
  const text = {
    ...common,
    titleRule: '='.repeat(Math.min(TEXT_WIDTH, [...document.title].length)),
    organisation: wrap(common.organisation),
    attachmentLine: wrap(attachmentLine),
    footerLine: wrap(footerLine),
    sections: body.map((section) => ({
      blocks: (section.detail ? detail(section, pdfName) : flat(section.blocks)).flatMap(textBlock),
    })),
  };
  return { html, text };
}

/** A section's blocks with its subsections' blocks in their place. */
function flat(blocks: Block[]): Block[] {
  return blocks.flatMap((b) => (b.kind === 'section' ? flat(b.blocks) : [b]));
}

/** An appendix in the message: its heading and where to find it. */
function detail(section: SectionBlock, pdfName: string): Block[] {
  const title = section.blocks.find((b) => b.kind === 'heading');
  return [...(title ? [title] : []), { kind: 'note', text: WORDS.inAttachment(pdfName) }];
}

type EmailBlock = Record<string, unknown> & { kind: string };

function htmlBlock(b: Block, image: (chart: Chart) => Record<string, unknown> | null): EmailBlock[] {
  switch (b.kind) {
    case 'key-figures':
      return [{ kind: 'key-figures', rows: pairs(b.items) }];
    case 'figures':
      return [{ kind: 'figures', images: b.charts.map(image).filter((x) => x !== null) }];
    case 'table':
      return [{ kind: 'table', ...narrowTable(b) }];
    case 'overview':
      return [
        {
          kind: 'overview',
          headers: b.headers,
          rows: b.rows.map((r) => ({ ...r, spark: r.spark ? image(r.spark) : null })),
        },
      ];
    case 'heading':
      return [{ ...b, h2: b.level === 2 }];
    default:
      return [{ ...b }];
  }
}

/**
 * A table for a 600 px column: the comparisons' two spans go under the label instead of in columns of
 * their own. Every row's first cell is its header (th scope="row").
 */
function narrowTable(t: Table & { role: string }): {
  caption: string;
  headers: { text: string; numeric: boolean }[];
  rows: { label: string; spans: string; cells: { text: string; numeric: boolean }[] }[];
} {
  const spans = t.role === 'comparisons';
  const keep = t.headers.map((_, c) => !(spans && (c === 1 || c === 2)));
  return {
    caption: t.caption,
    headers: t.headers.map((text, c) => ({ text, numeric: t.numeric[c] })).filter((_, c) => keep[c]),
    rows: t.rows.map((r) => ({
      label: r[0],
      spans: spans ? WORDS.spansAgainst(r[1], r[2]) : '',
      cells: r.map((text, c) => ({ text, numeric: t.numeric[c] })).filter((_, c) => c > 0 && keep[c]),
    })),
  };
}

function textBlock(b: Block): EmailBlock[] {
  switch (b.kind) {
    case 'heading':
      return [
        {
          kind: 'heading',
          text: b.text,
          rule: (b.level === 2 ? '-' : '·').repeat(Math.min(TEXT_WIDTH, [...b.text].length)),
        },
      ];
    case 'headline':
    case 'note':
      return [{ kind: 'paragraph', text: wrap(b.text) }];
    case 'statements':
      return b.items.map((x) => ({ kind: 'paragraph', text: wrap(x.text) }));
    case 'key-figures':
      return [
        {
          kind: 'list',
          title: WORDS.keyFigures,
          lines: b.items.map((k) => wrap(`- ${k.label}: ${k.value}${k.note ? ` (${k.note})` : ''}`, '  ')),
        },
      ];
    case 'table': {
      const spans = b.role === 'comparisons';
      return [
        {
          kind: 'list',
          title: wrap(b.caption),
          lines: b.rows.map((r) => {
            const from = spans ? 3 : 1;
            const figures = r
              .slice(from)
              .map((v, i) => `${b.headers[i + from]}: ${v}`)
              .join('; ');
            const head = spans ? `${r[0]}, ${WORDS.spansAgainst(r[1], r[2])}` : r[0];
            return wrap(`- ${head}: ${figures}`, '  ');
          }),
        },
      ];
    }
    case 'overview':
      return [{ kind: 'list', title: '', lines: b.rows.map((r) => wrap(`- ${r.text}`, '  ')) }];
    case 'cautions':
      return [{ kind: 'list', title: b.title, lines: b.items.map((c) => wrap(`- ${c}`, '  ')) }];
    case 'facts':
      return [{ kind: 'list', title: b.title, lines: b.items.map((f) => wrap(`- ${f.label}: ${f.value}`, '  ')) }];
    default:
      // Figures are pictures: the text part leaves them to the HTML part and the PDF.
      return [];
  }
}

function pairs<T>(items: T[]): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += 2) out.push(items.slice(i, i + 2));
  return out;
}

/**
 * Greedy word wrap at ordinary spaces only: the no-break spaces some locales put inside numbers stay put.
 * A word longer than the line is left whole rather than cut.
 */
export function wrap(text: string, indent = '', width = TEXT_WIDTH): string {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ').filter((w) => w !== '')) {
    const candidate = line === '' ? (lines.length === 0 ? word : indent + word) : `${line} ${word}`;
    if ([...candidate].length > width && line !== '') {
      lines.push(line);
      line = indent + word;
    } else {
      line = candidate;
    }
  }
  if (line !== '') lines.push(line);
  return lines.join('\n');
}

/** RFC 5322 §2.3: CR and LF only together. */
function crlf(s: string): string {
  return s.replace(/\r\n?/g, '\n').replace(/\n/g, '\r\n');
}

function defaultSubject(view: Pick<BriefView, 'series' | 'title'>): string {
  const periods = [...new Set(view.series.map((s) => s.reportingPeriod))];
  return periods.length > 0 ? `${view.title} — ${periods.join(', ')}` : view.title;
}

type Template = (context: unknown) => string;
const compiled = new Map<string, { html: Template; text: Template }>();

/**
 * The two templates on their own Handlebars instance (no helpers or partials leak in or out). The HTML one
 * escapes every value; the plain-text one does not, since text/plain has no markup to escape against. A
 * file of the same name in the job's templates folder replaces the built-in one; a broken one fails with
 * one line naming it.
 */
function templates(overrides: string | null): { html: Template; text: Template } {
  const key = overrides ?? '';
  const cached = compiled.get(key);
  if (cached) return cached;
  const hb = isolatedHandlebars();
  const load = (name: string, noEscape: boolean): Template => {
    const custom = overrides ? join(overrides, name) : null;
    const file = custom && existsSync(custom) ? custom : join(TEMPLATE_DIR, name);
    let source: string;
    try {
      source = readRegularFile(file).toString('utf8');
    } catch (e) {
      if (e instanceof NotRegularFile) throw notOrdinary(file, e);
      const code = (e as NodeJS.ErrnoException).code ?? 'error';
      throw new BriefError(
        'template-missing',
        `cannot read the email template (${code})`,
        'reinstall trendbrief, or fix brief.templates in the job',
        { file },
        1,
      );
    }
    const broken = (e: unknown) => {
      const first = (e instanceof Error ? e.message : String(e)).split('\n')[0];
      return withCause(
        new BriefError(
          'template-invalid',
          `the email template does not work: ${first}`,
          'fix the template, or remove it to use the built-in one',
          { file },
        ),
        e,
      );
    };
    let render: Template;
    try {
      hb.parse(source); // compile() is lazy: parse now so a syntax error names the file before any rendering
      render = hb.compile(source, { noEscape });
    } catch (e) {
      throw broken(e);
    }
    return (context) => {
      try {
        return render(context);
      } catch (e) {
        throw broken(e);
      }
    };
  };
  const result = { html: load('email.hbs', false), text: load('email.txt.hbs', true) };
  compiled.set(key, result);
  return result;
}

/** templates/ at the package root, from src/render/ in development and from dist/render/ once built. */
const TEMPLATE_DIR = fileURLToPath(new URL('../../templates/', import.meta.url));
