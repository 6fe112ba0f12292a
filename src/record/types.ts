/**
 * The record of what each brief said: one append-only table of entries, chained by hash. A publication
 * entry holds one series of one brief for one reporting period (its figures, statements, data values and
 * files); a delivery entry holds one email message's fate at one recipient.
 */

export type EntryKind = 'publication' | 'delivery';

/** An entry as the caller writes it; the store adds seq, issue, time and the chain. */
export interface NewEntry {
  kind: EntryKind;
  /** Name of the brief in the record (record.name, else its title). */
  brief: string;
  /** The group of a job split by a column; '' for none. */
  group: string;
  /** Series id; '' for a delivery. */
  series: string;
  /** Reporting period as an ISO date (the period's first day); for a delivery, the brief's periods. */
  period: string;
  /** Why this was issued again, as the user said it (--reason); '' for the store's own words. */
  reason: string;
  toolVersion: string;
  /** The run this entry came from (--run, the scheduler's job id, or a fresh id). */
  run: string;
  /** "K/N", or '' outside a sharded run. */
  shard: string;
  jobSha256: string;
  dataSha256: string;
  /** A delivery's message key (what the brief says, hashed); '' for a publication. */
  message: string;
  /** A delivery's recipient; '' for a publication. */
  recipient: string;
  /** A delivery: 'accepted' or 'refused'; a publication: ''. */
  status: string;
  /** JSON text of the body (PublicationBody or DeliveryBody). */
  body: string;
}

export interface Entry extends NewEntry {
  seq: number;
  /** 1 for the first publication of a series and period, 2 for its first re-issue…; 0 for a delivery. */
  issue: number;
  /** ISO date-time the entry was written. */
  recordedAt: string;
  prevHash: string;
  hash: string;
}

/** What a publication entry says about one series. */
export interface PublicationBody {
  title: string;
  label: string;
  unit: string;
  frequency: string;
  /** The key figures, as numbers (null where undefined). */
  figures: Record<string, number | string | null>;
  comparisons: {
    id: string;
    label: string;
    current: number | null;
    baseline: number | null;
    percent: number | null;
    adjustedPercent: number | null;
  }[];
  statements: {
    id: string;
    kind: string;
    text: string;
    figures: { name: string; value: number | string | null; formatted: string }[];
    claim?: unknown;
  }[];
  /** The data used: each period's ISO date and observed value up to the reporting period. */
  dates: string[];
  values: (number | null)[];
  /** The trend's year-over-year percent at the reporting period, as published. */
  trendYoYPercent: number | null;
  dataFile: string;
  jobFile: string;
  generatedAt: string;
  files: { path: string; sha256: string; bytes: number }[];
}

export interface DeliveryBody {
  file: string;
  sha256: string;
  response: string;
}
