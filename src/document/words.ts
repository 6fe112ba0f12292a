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

/** The fixed words of a series' key figures, tables and data facts (view.ts formats the numbers in them). */
export const SERIES_WORDS = {
  direction: { rising: 'Rising', falling: 'Falling', 'broadly-unchanged': 'Broadly unchanged', unknown: 'n/a' },
  trendYoY: 'Trend, year on year',
  /** With less than two years of data: "Trend, on a week earlier". */
  trendOn: (back: string) => `Trend, on ${back}`,
  onPeriod: (period: string) => `on ${period}`,
  trendDirection: 'Trend direction',
  inARow: (count: string) => `for ${count} in a row`,
  latestValue: (period: string) => `Latest value, ${period}`,
  rawOnYearAgo: (change: string, back = 'a year ago') => `raw ${change} on ${back}`,
  adjustedOnPrevious: 'Seasonally adjusted, on previous period',
  unadjustedOnPrevious: 'On previous period (not seasonally adjusted)',
  annualised: (periods: 'months' | 'quarters') => `Trend growth, last 6 ${periods}, annualised`,
  typicalRevision: 'Typical revision of the first estimate',
  withinRange: (within: number, checked: number, low: string, high: string) =>
    `${within} of ${checked} between ${low} and ${high}`,
  comparisonsCaption: (label: string, aggregation: 'sum' | 'mean') =>
    `Comparisons for ${label}${aggregation === 'sum' ? ' (totals)' : ' (averages)'}`,
  /** `unit` is " £ thousand" or "" (a space before it). */
  comparisonHeaders: (unit: string) => [
    'Comparison',
    'Current span',
    'Baseline span',
    `Current${unit}`,
    `Baseline${unit}`,
    'Change',
    'Change, adjusted',
    'Change, trend',
  ],
  partYear: ' (part year)',
  notAdjusted: 'not adjusted',
  unusualInLast: (years: number) => `Unusual periods in the last ${years === 2 ? 'two' : years} years`,
  unusualSince: (period: string) => `Unusual periods since ${period}`,
  unusualHeaders: (unit: string, multiplicative: boolean) => [
    'Period',
    `Observed${unit}`,
    multiplicative ? 'Against expected' : `Against expected${unit}`,
    'Robust score',
  ],
  revisionsCaption: (unit: string) => `First and settled estimates of the trend’s year-on-year change (${unit})`,
  revisionHeaders: (unit: string) => [
    'Period',
    'First estimate',
    'Settled estimate',
    `Revision, settled − first (${unit})`,
  ],
  publishedCaption: 'Published first estimates and today’s estimates of the trend’s year-on-year change (percent)',
  publishedHeaders: ['Period', 'As published', 'Today', 'Revision (pts)'],
  database: 'Database',
  dataFile: 'Data file',
  sheet: 'Sheet',
  query: 'Query',
  queryHash: 'SHA-256 of query and rows',
  fileHash: 'SHA-256',
  rowsRead: 'Rows read',
  dateColumn: 'Date column',
  valueColumn: 'Value column',
  missingPeriods: 'Missing periods',
  none: 'none',
  note: 'Note',
  provisional: 'Provisional',
  provisionalMarked: (reason: string) => `periods marked * (${reason})`,
  /** `unit` is " (£ thousand)" or "". */
  dataCaption: (label: string, unit: string) => `Data and components of ${label}${unit}`,
  dataHeaders: ['Period', 'Observed', 'Trend', 'Seasonal', 'Adjusted', 'Remainder'],
} as const;

/** The fixed words of the method appendix's table of settings and of what the brief's words mean. */
export const METHOD_WORDS = {
  caption: 'Settings used',
  headers: ['Setting', 'Value'],
  method: 'Method',
  methods: { classical: 'Classical decomposition', stl: 'STL', mstl: 'MSTL' },
  model: 'Model',
  additive: 'additive: data = trend + seasonal + remainder',
  multiplicative: (how: string, matched: boolean) =>
    `multiplicative (trend × seasonal × remainder, ${how}): adjusted yearly totals can differ from raw ones${matched ? ', so they are matched to them (see Yearly totals)' : ''}`,
  ratios: 'ratios to a moving average',
  onLogarithms: (method: string) => `${method} on logarithms`,
  modelChosen: 'How the model was chosen',
  seasonalPeriod: 'Seasonal period',
  seasonalPeriods: 'Seasonal periods',
  trendFilter: 'Trend filter',
  henderson: (terms: number | null) => `Henderson, ${terms} terms`,
  centredAverage: (order: number) => `centred moving average of order ${order}`,
  seasonalWindow: 'Seasonal window',
  periodic: 'periodic',
  trendWindow: 'Trend window',
  lowpassWindow: 'Low-pass window',
  degrees: 'Degrees (seasonal, trend, low-pass)',
  passes: 'Inner and outer passes',
  robust: 'Robust',
  robustYes: 'yes (bisquare weights)',
  robustNo: 'no',
  iterations: 'MSTL iterations',
  finalTrend: 'Final trend',
  finalHenderson: (terms: number) => `Henderson, ${terms} terms, Musgrave end weights`,
  seasonalAdjustment: 'Seasonal adjustment',
  seasonRemoved: 'the seasonal component is removed',
  extension: 'Forecast extension',
  yearlyTotals: 'Yearly totals',
  extended: (added: string, model: string | null, reason: string) =>
    `${added} of forecasts from ${model} added before decomposing (${reason}); components kept up to the last observation; the firmness study extends each earlier cut by the same orders, their coefficients re-estimated on the cut`,
  extensionSkipped: (why: string) => `skipped for this series: ${why}`,
  refits: 'Re-fits for firmness and sensitivity',
  refitsOn: (span: string) =>
    `each on the latest ${span} before its cut, not the whole series, which is too long to re-fit tens of times: on a test series this moved the trend's end estimate by up to a quarter of a percent`,
  changeExpressed: 'How change is expressed',
  asPercent: 'as a percent of the earlier value',
  inUnits: (unit: string) => `in ${unit || 'units'}${/%/.test(unit) ? ' (percentage points)' : ''}`,
  changeExpressedAs: (how: string, reason: string) =>
    `${how}: ${reason}; a percent is never taken of a value at or below zero`,
  directionWords: 'Direction words',
  revisionRangeRule: (range: string) =>
    `“broadly unchanged” when zero lies inside the yearly change of the trend plus the range of past revisions (later minus earlier estimate, 10th to 90th percentile: ${range}); otherwise up or down`,
  noiseRule: (noise: string, change = 'yearly change') =>
    `“broadly unchanged” when the ${change} of the trend is no larger than the noise of one period (1.4826 × MAD of what trend and season leave: ${noise}); otherwise up or down`,
  peakAndLow: 'Seasonal peak and low',
  peakAndLowMeaning:
    'the seasonal component averaged by season over the latest whole cycle; a percent is of the mean level of that cycle',
  unusualListed: 'Unusual periods listed',
  lastYears: (years: number) => `the last ${years} calendar years to the reporting period`,
  wholeSeries: 'the whole series',
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
