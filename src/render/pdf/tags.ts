/**
 * The PDF's logical structure (tagged PDF, ISO 32000-1 §14.8): every piece of content is either inside a
 * structure element (H1, P, Table, Figure …) or marked as an artifact (rules, page furniture, repeated
 * table headers), so assistive technology reads the brief in order and skips the decoration.
 *
 * pdfkit's rules, kept here in one place: an element's content is drawn by a closure that runs as soon as
 * the element is added to an attached parent; closures never nest (a grouping element such as Table or Sect
 * holds elements, never content of its own); artifacts are drawn only between closures, never inside one.
 */
export type Struct = PDFKit.PDFStructureElement;

interface ElementOptions {
  alt?: string;
  lang?: string;
  /** Table header cells: whether they head a column or a row. */
  scope?: 'Column' | 'Row';
  /** Figures: the bounding box on the page, [x0, y0, x1, y1] in pdfkit's top-down coordinates. */
  bbox?: [number, number, number, number];
}

interface Marking {
  tag: string;
  options?: object;
  structContent?: unknown;
}
interface Marks {
  page: { markings: Marking[] };
  markContent(tag: string, options?: object | null): unknown;
  endMarkedContent(): unknown;
  addContent(data: string): unknown;
}

/**
 * The root element every other element hangs from. The document's marked-content operator for an
 * element's content (a tag and its MCID, tens of thousands in a brief's tables) is written directly, as
 * pdfkit writes it, without its general dictionary converter; every other kind goes to pdfkit.
 */
export function documentRoot(doc: PDFKit.PDFDocument): Struct {
  const d = doc as unknown as Marks;
  const markContent = d.markContent;
  d.markContent = function (this: Marks, tag: string, options?: object | null) {
    const mcid = (options as { mcid?: unknown } | null | undefined)?.mcid;
    if (tag === 'Artifact' || tag === 'Span' || typeof mcid !== 'number' || Object.keys(options as object).length !== 1)
      return markContent.call(this, tag, options);
    // As pdfkit: content of a structure element closes any marked content still open (pdfkit tests the
    // MCID for truth, so not for the first content of a page, which may be content carried over).
    if (mcid) {
      let toClose = 0;
      for (const m of this.page.markings) if (toClose || m.structContent || m.tag === 'Artifact') toClose++;
      while (toClose--) this.endMarkedContent();
    }
    this.page.markings.push({ tag, options: options as object });
    this.addContent(`/${tag} <<\n/MCID ${mcid}\n>> BDC`);
    return this;
  };
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

/** Decoration outside the logical content: rules, backgrounds, running headers, repeated table headers. */
export function artifact(doc: PDFKit.PDFDocument, draw: () => void, type: 'Layout' | 'Pagination' = 'Layout'): void {
  doc.markContent('Artifact', { type });
  draw();
  doc.endMarkedContent();
}
