/**
 * The brief as a document: a sequence of typed blocks, built once from the Brief's display view
 * (build.ts) and walked by every writer — the HTML templates (one partial per block kind, named after
 * it), the built-in PDF engine (render/pdf/document.ts) and the email's HTML and text parts. A writer
 * decides how a block looks, never whether it is there or what it says.
 *
 * Blocks are plain data (no functions, no classes): the HTML templates read them as they are.
 */
import type { Chart } from '../vocabulary/brief.js';

/** A label and its value, as the byline and the appendix's facts show them. */
export interface Fact {
  label: string;
  value: string;
  /** An ISO instant when the value is a formatted time (HTML writes it as <time datetime>). */
  time?: string;
}

export interface KeyFigure {
  label: string;
  value: string;
  note: string;
}

export interface Table {
  caption: string;
  headers: string[];
  /** Which columns hold numbers (right-aligned). */
  numeric: boolean[];
  rows: string[][];
}

/** A part of the brief with a heading; its blocks in reading order. */
export interface SectionBlock {
  kind: 'section';
  /** What the section is: masthead, contents, overview, series, comparisons, cautions, appendix-method… */
  name: string;
  /** The element id (HTML) and link target; null when nothing links to it. */
  id: string | null;
  /** The id of its heading, for aria-labelledby; null when it is not a landmark of its own. */
  labelledBy: string | null;
  /** Opens with a heading of its own (a section in the HTML sense); the masthead and contents do not. */
  titled: boolean;
  /** A bookmark in the PDF's outline, or null. */
  outline: string | null;
  /** Starts on a page of its own in a paged format. */
  newPage: boolean;
  /** Detail the email leaves to the attached PDF (the appendices). */
  detail: boolean;
  blocks: Block[];
}

export interface MastheadBlock {
  kind: 'masthead';
  organisation: string;
  title: string;
  logo: { mime: string; dataUri: string; alt: string } | null;
  byline: Fact[];
}

export interface ContentsBlock {
  kind: 'contents';
  title: string;
  /** The navigation's accessible name. */
  label: string;
  entries: { text: string; note: string; target: string }[];
}

export interface HeadingBlock {
  kind: 'heading';
  level: 2 | 3 | 4;
  text: string;
  id: string | null;
  /** Shown after the text, in a lighter face ("(t)"); empty for none. */
  unit: string;
}

export interface HeadlineBlock {
  kind: 'headline';
  text: string;
}

/** Paragraphs, one statement each. */
export interface StatementsBlock {
  kind: 'statements';
  items: { kind: string; text: string }[];
}

export interface KeyFiguresBlock {
  kind: 'key-figures';
  items: KeyFigure[];
}

export interface FiguresBlock {
  kind: 'figures';
  /** Prefix of each figure's element id. */
  anchor: string;
  charts: Chart[];
}

export interface TableBlock extends Table {
  kind: 'table';
  /** What the table holds (comparisons, unusual, revisions, method, data): a class name for styling. */
  role: string;
  /** Keep on one page when it fits on one. */
  keepTogether: boolean;
}

export interface FactsBlock {
  kind: 'facts';
  title: string;
  /** sources (method and publication) or facts (label and value). */
  role: 'sources' | 'facts';
  items: Fact[];
}

export interface NoteBlock {
  kind: 'note';
  text: string;
}

export interface CautionsBlock {
  kind: 'cautions';
  title: string;
  items: string[];
}

/** One row of the overview: a series at a glance. */
export interface OverviewRow {
  label: string;
  /** Link target of the series' own section. */
  target: string;
  /** The cells after the label, in the order of the headers after the first. */
  cells: { value: string; note: string }[];
  /** The overview statement the row shows (its claims are verified): the text part of the email prints it. */
  text: string;
  /** The trend over the last years as a small line chart. */
  spark: Chart | null;
}

export interface OverviewBlock {
  kind: 'overview';
  headers: string[];
  rows: OverviewRow[];
}

export type Block =
  | SectionBlock
  | MastheadBlock
  | ContentsBlock
  | HeadingBlock
  | HeadlineBlock
  | StatementsBlock
  | KeyFiguresBlock
  | FiguresBlock
  | TableBlock
  | FactsBlock
  | NoteBlock
  | CautionsBlock
  | OverviewBlock;

/** The whole brief: what every format's frame needs, and the top-level sections in reading order. */
export interface BriefDocument {
  lang: string;
  title: string;
  /** The title with the organisation, for a window or tab ("Title — Organisation"). */
  fullTitle: string;
  accent: string;
  pageSize: 'A4' | 'Letter';
  toolVersion: string;
  sections: SectionBlock[];
}
