/**
 * The PDF's logical structure (tagged PDF, ISO 32000-1 §14.8): every piece of content is either inside a
 * structure element (H1, P, Table, Figure …) or marked as an artifact (rules, page furniture, repeated
 * table headers), so assistive technology reads the brief in order and skips the decoration.
 *
 * pdfkit's rules, kept here in one place: an element's content is drawn by a closure that runs as soon as
 * the element is added to an attached parent; closures never nest (a grouping element such as Table or Sect
 * holds elements, never content of its own); artifacts are drawn only between closures, never inside one.
 */
import { BriefDocument, type OpenCell, TableRow } from './document.js';

export type Struct = PDFKit.PDFStructureElement;

interface ElementOptions {
  alt?: string;
  lang?: string;
  /** Table header cells: whether they head a column or a row. */
  scope?: 'Column' | 'Row';
  /** Figures: the bounding box on the page, [x0, y0, x1, y1] in pdfkit's top-down coordinates. */
  bbox?: [number, number, number, number];
}

/** The root element every other element hangs from. */
export function documentRoot(doc: PDFKit.PDFDocument): Struct {
  const root = doc.struct('Document');
  doc.addStructure(root);
  return root;
}

/** A grouping element (Sect, Table, TR, L, LI) added to parent; the caller ends it once it is filled. */
export function group(doc: PDFKit.PDFDocument, parent: Struct, type: string): Struct {
  const el = doc.struct(type);
  parent.add(el);
  return el;
}

/** A content element whose marks are what draw() paints, drawn at once. */
export function leaf(
  doc: PDFKit.PDFDocument,
  parent: Struct,
  type: string,
  draw: () => void,
  options: ElementOptions = {},
): void {
  parent.add(doc.struct(type, options as PDFKit.Mixins.StructureElementOptions, draw));
}

/** The document as the brief's (the text setter, text.ts, draws on nothing else either). */
function briefDocument(doc: PDFKit.PDFDocument): BriefDocument {
  if (!(doc instanceof BriefDocument)) throw new Error('table cells are tagged on a BriefDocument only');
  return doc;
}

/** A table row (TR) added to parent, for cells made by beginCell and endCell; the caller ends it once filled. */
export function tableRow(doc: PDFKit.PDFDocument, parent: Struct): TableRow {
  const tr = new TableRow(briefDocument(doc));
  parent.add(tr);
  return tr;
}

/**
 * A table cell (TH or TD) of a row, its content what is drawn until endCell: the element leaf() would
 * make, without a structure element object and a closure for each cell (document.ts).
 */
export function beginCell(
  doc: PDFKit.PDFDocument,
  row: TableRow,
  type: 'TH' | 'TD',
  scope?: 'Column' | 'Row',
): OpenCell {
  return briefDocument(doc).beginCell(row, type, scope);
}

export function endCell(doc: PDFKit.PDFDocument, cell: OpenCell): void {
  briefDocument(doc).endCell(cell);
}

/** Decoration outside the logical content: rules, backgrounds, running headers, repeated table headers. */
export function artifact(doc: PDFKit.PDFDocument, draw: () => void, type: 'Layout' | 'Pagination' = 'Layout'): void {
  doc.markContent('Artifact', { type });
  draw();
  doc.endMarkedContent();
}
