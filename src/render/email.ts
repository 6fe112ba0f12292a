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
 * composed by nodemailer's MailComposer. The bytes depend on the Brief and the attachments alone: Date is
 * the brief's generatedAt, Message-ID and the MIME boundaries are cut from a SHA-256 of the content, and
 * line breaks are CRLF throughout, so two renders of the same Brief give the same file.
 */
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import MailComposer, { type MailComposerOptions } from 'nodemailer/lib/mail-composer';
import type { Brief, Chart } from '../brief/model.js';
import { BriefError, withCause } from '../errors.js';
import { isAddress, splitAddressList } from '../job/address.js';
import type { EmailSpec } from '../job/types.js';
import { NotRegularFile, readRegularFile } from '../read-file.js';
import { isolatedHandlebars } from './handlebars.js';
import { notOrdinary } from './templates.js';
import { type BriefView, briefView, type SeriesView } from './view.js';

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
 * One Content-ID per chart, from the series and chart ids (both plain words; anything else becomes a dash,
 * keeping the id inside the dot-atom syntax RFC 5322 §3.6.4 gives message ids).
 */
export function emailImages(brief: Brief, toPng: (chart: Chart) => Buffer): EmailImage[] {
  const safe = (s: string) => s.replace(/[^A-Za-z0-9-]+/g, '-').replace(/^-+|-+$/g, '') || 'x';
  return brief.series.flatMap((s, i) =>
    s.charts.map((chart) => ({
      cid: `${i + 1}.${safe(s.id)}.${safe(chart.id)}@${ID_DOMAIN}`,
      chart,
      png: toPng(chart),
    })),
  );
}

export async function renderEmail(brief: Brief, options: EmailOptions): Promise<Buffer> {
  const view = briefView(brief);
  const headers = emailHeaders(brief, options.email, options.overrides);
  const images = new Map(options.pngs.map((p) => [p.chart, p]));
  const model = emailModel(view, headers.subject, options.pdfName, images);
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

function emailModel(view: BriefView, subject: string, pdfName: string, images: Map<Chart, EmailImage>): Models {
  const periods = [...new Set(view.series.map((s) => s.reportingPeriod))];
  const periodLine = `Reporting period: ${periods.join(', ')}`;
  const multiple = view.series.length > 1;
  const attachmentLine = `The full brief, with its charts and tables, is attached as ${pdfName}.`;
  const footerLine = `Generated ${view.generatedAt} by trendbrief ${view.toolVersion} from ${view.jobFile} (data fingerprint ${view.fingerprint}).`;
  const common = {
    lang: view.lang,
    subject,
    title: view.title,
    organisation: [view.organisation, view.author].filter(Boolean).join(' · '),
    periodLine,
    multiple,
    cautionsHeading: 'Please note',
    attachmentLine,
    footerLine,
  };
  const inner = WIDTH - 2 * PAD;
  const html = {
    ...common,
    width: WIDTH,
    pad: PAD,
    accent: /^#[0-9A-Fa-f]{6}$/.test(view.accent) ? view.accent : '#1F5C99',
    preheader: view.series[0]?.headline?.text ?? '',
    cautions: view.cautions.map((c) => c.text),
    series: view.series.map((s) => ({
      label: s.label,
      headline: s.headline?.text ?? '',
      statements: s.statements.map((x) => x.text),
      keyFigureRows: pairs(s.keyFigures),
      comparisons: comparisonTable(s),
      charts: s.charts.flatMap((chart) => {
        const image = images.get(chart);
        if (!image) return [];
        const width = Math.min(chart.width, inner);
        return [
          {
            cid: image.cid,
            title: chart.title,
            alt: chart.alt,
            caption: chart.caption,
            width,
            height: Math.round((chart.height * width) / chart.width),
          },
        ];
      }),
    })),
  };
  const text = {
    ...common,
    titleRule: '='.repeat(Math.min(TEXT_WIDTH, [...view.title].length)),
    organisation: wrap(common.organisation),
    cautions: view.cautions.map((c) => wrap(`- ${c.text}`, '  ')),
    attachmentLine: wrap(attachmentLine),
    footerLine: wrap(footerLine),
    series: view.series.map((s) => ({
      label: s.label,
      labelRule: '-'.repeat(Math.min(TEXT_WIDTH, [...s.label].length)),
      headline: wrap(s.headline?.text ?? ''),
      statements: s.statements.map((x) => wrap(x.text)),
      keyFiguresHeading: 'Key figures',
      keyFigures: s.keyFigures.map((k) => wrap(`- ${k.label}: ${k.value}${k.note ? ` (${k.note})` : ''}`, '  ')),
      comparisonsCaption: wrap(s.comparisons.caption),
      comparisons: comparisonLines(s),
    })),
  };
  return { html, text };
}

/** The comparisons for a 600 px column: the two spans go under the label instead of in columns of their own. */
function comparisonTable(s: SeriesView): {
  caption: string;
  headers: string[];
  rows: { label: string; spans: string; figures: string[] }[];
} {
  const t = s.comparisons;
  return {
    caption: t.caption,
    headers: [t.headers[0], ...t.headers.slice(3)],
    rows: t.rows.map((r) => ({ label: r[0], spans: `${r[1]} against ${r[2]}`, figures: r.slice(3) })),
  };
}

function comparisonLines(s: SeriesView): string[] {
  const t = s.comparisons;
  return t.rows.map((r) => {
    const figures = r
      .slice(3)
      .map((v, i) => `${t.headers[i + 3]}: ${v}`)
      .join('; ');
    return wrap(`- ${r[0]}, ${r[1]} against ${r[2]}: ${figures}`, '  ');
  });
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

function defaultSubject(view: BriefView): string {
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
