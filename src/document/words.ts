/**
 * Every fixed word of the brief — headings, labels, notes, captions and the fallback accent colour — in one
 * place. The document builder (build.ts) is the only reader: the HTML, PDF and email writers print what the
 * blocks say and know none of these words themselves, so no two formats can word the same thing apart.
 */

export const WORDS = {
  contents: 'In this brief',
  contentsLabel: 'Series in this brief',
  overview: 'At a glance',
  overviewNote:
    'Each series’ latest value, the trend’s change over a year and its direction, how much first estimates of that change typically move, and the unusual periods found; the line is the trend over the last three years.',
  overviewHeaders: ['Series', 'Latest value', 'Trend over a year', 'Typical revision', 'Unusual periods', 'Trend'],
  overviewLatestIn: (period: string) => `Latest value, ${period}`,
  overviewUnusualIn: (span: string) => `Unusual periods ${span}`,
  cautions: 'Read with care',
  methodAppendix: 'Appendix A: method',
  dataAppendix: 'Appendix B: data',
  sources: 'Published sources',
  dataRead: 'Data read',
  thisRun: 'This run',
  comparisons: 'Comparisons',
  unusual: 'Unusual periods',
  firmness: 'Firmness and sensitivity',
  keyFigures: 'Key figures',
  notAvailable: 'n/a',
  points: 'pts',
  sparkAlt: (label: string) => `The trend of ${label} over the last three years`,
  dataNote:
    'Every period, with the components the method found. Periods marked * are provisional: their trend rests on end weights and will move as new data come in.',
  reportingPeriod: 'Reporting period',
  preparedBy: 'Prepared by',
  contact: 'Contact',
  generated: 'Generated',
  jobFile: 'Job file',
  jobSha256: 'Job SHA-256',
  fingerprint: 'Data fingerprint',
  tool: 'Tool',
  logoOf: (organisation: string) => `${organisation || 'Organisation'} logo`,
  reportingPeriodOf: (label: string) => `Reporting period, ${label}`,
  reportingPeriods: (periods: string[]) => `Reporting period: ${periods.join(', ')}`,
  spansAgainst: (current: string, baseline: string) => `${current} against ${baseline}`,
  attached: (pdfName: string) => `The full brief, with its charts and tables, is attached as ${pdfName}.`,
  inAttachment: (pdfName: string) => `In the attached ${pdfName}.`,
  footer: (generatedAt: string, version: string, jobFile: string, fingerprint: string) =>
    `Generated ${generatedAt} by trendbrief ${version} from ${jobFile} (data fingerprint ${fingerprint}).`,
  pageFoot: (generatedAt: string, fingerprint: string) => `Generated ${generatedAt} · data ${fingerprint}`,
  continued: (caption: string) => `${caption} (continued)`,
  pageOf: (page: number | string, pages: number | string) => `Page ${page} of ${pages}`,
  dataLimit: (shown: string, total: string) =>
    `The latest ${shown} of ${total} periods are listed; every period is in the JSON brief (--format json).`,
} as const;

/**
 * The accent used when a colour that reaches a writer is not #rrggbb (the job's schema checks it; this is
 * the second lock). The same colour as the job's default accent.
 */
export const FALLBACK_ACCENT = '#1F5C99';

/** The accent colour if it is #rrggbb, else the fallback. */
export function safeAccent(colour: string): string {
  return /^#[0-9a-fA-F]{6}$/.test(colour) ? colour : FALLBACK_ACCENT;
}
