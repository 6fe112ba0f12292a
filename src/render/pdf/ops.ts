/**
 * Speed: path and paint operators written as pdfkit's own drawing calls write them, byte for byte, but
 * gathered and handed to the page in one write. A chart is hundreds of operators; through pdfkit each is a
 * call that formats its numbers, parses its colour and writes one operator at a time. pdfkit writes each
 * operator followed by a line feed, so n operators joined by line feeds and written once are the same bytes
 * (test/render/pdf-ops.test.ts draws the same marks both ways and compares the pages).
 *
 * Only what leaves pdfkit's own state alone goes through here: paths, colours, line styles, painting, and a
 * save/restore pair with no transform between. Opacity (a graphics-state resource), dashes and transforms
 * are still pdfkit's calls, made after `flush`.
 */
import { BriefDocument } from './document.js';

/** pdfkit's PDFObject.number: rounded to six decimals, as a JavaScript number prints. */
export function pdfNumber(n: number): string {
  if (!(n > -1e21 && n < 1e21)) throw new Error(`unsupported number: ${n}`);
  return `${Math.round(n * 1e6) / 1e6}`;
}

/** pdfkit's bezier constant for a quarter circle. */
const KAPPA = 4.0 * ((Math.sqrt(2) - 1.0) / 3.0);

const CAPS: Record<string, number> = { butt: 0, round: 1, square: 2 };
const JOINS: Record<string, number> = { miter: 0, round: 1, bevel: 2 };

export class Ops {
  private parts: string[] = [];
  private readonly colours = new Map<string, string | null>();

  private readonly doc: BriefDocument;

  constructor(doc: PDFKit.PDFDocument) {
    if (!(doc instanceof BriefDocument)) throw new Error('the chart drawer draws on a BriefDocument only');
    this.doc = doc;
  }

  /** Hands what is gathered to the page; call before any pdfkit call that writes. */
  flush(): void {
    if (this.parts.length === 0) return;
    this.doc.addContent(this.parts.join('\n'));
    this.parts = [];
  }

  raw(op: string): this {
    this.parts.push(op);
    return this;
  }

  moveTo(x: number, y: number): this {
    return this.raw(`${pdfNumber(x)} ${pdfNumber(y)} m`);
  }

  lineTo(x: number, y: number): this {
    return this.raw(`${pdfNumber(x)} ${pdfNumber(y)} l`);
  }

  rect(x: number, y: number, w: number, h: number): this {
    return this.raw(`${pdfNumber(x)} ${pdfNumber(y)} ${pdfNumber(w)} ${pdfNumber(h)} re`);
  }

  closePath(): this {
    return this.raw('h');
  }

  /** pdfkit's circle (its ellipse with equal radii), the same arithmetic in the same order. */
  circle(cx: number, cy: number, radius: number): this {
    const x = cx - radius;
    const y = cy - radius;
    const o = radius * KAPPA;
    const xe = x + radius * 2;
    const ye = y + radius * 2;
    const xm = x + radius;
    const ym = y + radius;
    this.moveTo(x, ym);
    this.curve(x, ym - o, xm - o, y, xm, y);
    this.curve(xm + o, y, xe, ym - o, xe, ym);
    this.curve(xe, ym + o, xm + o, ye, xm, ye);
    this.curve(xm - o, ye, x, ym + o, x, ym);
    return this.closePath();
  }

  private curve(a: number, b: number, c: number, d: number, e: number, f: number): void {
    this.raw(`${pdfNumber(a)} ${pdfNumber(b)} ${pdfNumber(c)} ${pdfNumber(d)} ${pdfNumber(e)} ${pdfNumber(f)} c`);
  }

  /**
   * pdfkit's fillColor or strokeColor without opacity: the colour space, then the components. False for a
   * colour pdfkit does not know (it then writes nothing), as pdfkit's own call.
   */
  colour(colour: string, stroke: boolean): boolean {
    const key = `${stroke ? 'S' : 'f'}${colour}`;
    let op = this.colours.get(key);
    if (op === undefined) {
      const c = this.doc.colourComponents(colour);
      op =
        c === null
          ? null
          : `/${c.length === 4 ? 'DeviceCMYK' : 'DeviceRGB'} ${stroke ? 'CS' : 'cs'}\n${c.join(' ')} ${stroke ? 'SCN' : 'scn'}`;
      this.colours.set(key, op);
    }
    // pdfkit remembers the last fill colour (for text it flows onto a new page); so do we.
    if (!stroke) this.doc.rememberFillColour(colour);
    if (op === null) return false;
    this.raw(op);
    return true;
  }

  lineWidth(w: number): this {
    return this.raw(`${pdfNumber(w)} w`);
  }

  lineCap(cap: string): this {
    return this.raw(`${CAPS[cap]} J`);
  }

  lineJoin(join: string): this {
    return this.raw(`${JOINS[join]} j`);
  }
}
