/**
 * A tiny XML well-formedness checker and tree builder for the chart tests, following the XML 1.0
 * specification (W3C, 5th ed.) for what it covers: one root element, properly nested tags, quoted attribute
 * values without "<", unique attributes, and "&" only as one of the five predefined entities or a character
 * reference. No DTDs, CDATA or processing instructions beyond a leading declaration: neither vega nor our
 * scene writer writes any.
 */
export interface XmlElement {
  name: string;
  attrs: Record<string, string>;
  children: XmlNode[];
}
export type XmlNode = XmlElement | string;

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

function decode(text: string, where: number): string {
  return text.replace(/&([^;]*);|&/g, (_whole, body: string | undefined) => {
    if (body === undefined) throw new Error(`bare "&" near offset ${where}`);
    if (body in ENTITIES) return ENTITIES[body];
    const m = /^#(?:x([0-9a-fA-F]+)|([0-9]+))$/.exec(body);
    if (!m) throw new Error(`unknown entity &${body}; near offset ${where}`);
    return String.fromCodePoint(m[1] ? Number.parseInt(m[1], 16) : Number(m[2]));
  });
}

const NAME = /^[A-Za-z_:][-A-Za-z0-9_:.]*/;

export function parseXml(xml: string): XmlElement {
  let i = 0;
  if (xml.startsWith('<?xml')) i = xml.indexOf('?>') + 2;
  const root: XmlElement = { name: '#document', attrs: {}, children: [] };
  const stack: XmlElement[] = [root];
  while (i < xml.length) {
    const lt = xml.indexOf('<', i);
    const text = xml.slice(i, lt < 0 ? xml.length : lt);
    if (text.length > 0) {
      if (text.includes(']]>')) throw new Error(`"]]>" in text at ${i}`);
      const decoded = decode(text, i);
      if (stack.length === 1 && decoded.trim() !== '') throw new Error(`text outside the root at ${i}`);
      if (stack.length > 1) stack[stack.length - 1].children.push(decoded);
    }
    if (lt < 0) break;
    i = lt;
    if (xml.startsWith('<!--', i)) {
      const end = xml.indexOf('-->', i + 4);
      if (end < 0) throw new Error(`unclosed comment at ${i}`);
      i = end + 3;
      continue;
    }
    if (xml.startsWith('</', i)) {
      const m = NAME.exec(xml.slice(i + 2));
      const close = xml.indexOf('>', i);
      if (!m || close < 0 || xml.slice(i + 2 + m[0].length, close).trim() !== '')
        throw new Error(`bad end tag at ${i}`);
      const open = stack.pop();
      if (!open || open.name !== m[0] || stack.length === 0) throw new Error(`</${m[0]}> does not match at ${i}`);
      i = close + 1;
      continue;
    }
    const m = NAME.exec(xml.slice(i + 1));
    if (!m) throw new Error(`bad tag at ${i}`);
    const element: XmlElement = { name: m[0], attrs: {}, children: [] };
    let j = i + 1 + m[0].length;
    for (;;) {
      const ws = /^\s*/.exec(xml.slice(j))?.[0].length ?? 0;
      j += ws;
      if (xml.startsWith('/>', j) || xml[j] === '>') break;
      if (ws === 0) throw new Error(`missing space before attribute at ${j}`);
      const attr = /^([A-Za-z_:][-A-Za-z0-9_:.]*)\s*=\s*("([^"<]*)"|'([^'<]*)')/.exec(xml.slice(j));
      if (!attr) throw new Error(`bad attribute at ${j}`);
      if (attr[1] in element.attrs) throw new Error(`repeated attribute ${attr[1]} at ${j}`);
      element.attrs[attr[1]] = decode(attr[3] ?? attr[4], j);
      j += attr[0].length;
    }
    const parent = stack[stack.length - 1];
    if (parent === root && root.children.length > 0) throw new Error(`second root element at ${i}`);
    parent.children.push(element);
    if (xml.startsWith('/>', j)) i = j + 2;
    else {
      stack.push(element);
      i = j + 1;
    }
  }
  if (stack.length !== 1) throw new Error(`unclosed <${stack[stack.length - 1].name}>`);
  const top = root.children[0];
  if (typeof top !== 'object') throw new Error('no root element');
  return top;
}

/** Every element below (and including) `node` that satisfies `test`, in document order. */
export function findAll(node: XmlElement, test: (e: XmlElement) => boolean): XmlElement[] {
  const out: XmlElement[] = [];
  const visit = (e: XmlElement) => {
    if (test(e)) out.push(e);
    for (const c of e.children) if (typeof c === 'object') visit(c);
  };
  visit(node);
  return out;
}

/** The concatenated text inside an element, entities decoded. */
export function textOf(node: XmlElement): string {
  return node.children.map((c) => (typeof c === 'string' ? c : textOf(c))).join('');
}

/** The groups our scene writer (scene-svg.ts) gives the class `name` (a scene group's name). */
export function sceneGroup(root: XmlElement, name: string): XmlElement[] {
  return findAll(root, (e) => e.name === 'g' && e.attrs.class === name);
}

/** Direct child elements of a kind. */
export function childElements(node: XmlElement, name: string): XmlElement[] {
  return node.children.filter((c): c is XmlElement => typeof c === 'object' && c.name === name);
}
