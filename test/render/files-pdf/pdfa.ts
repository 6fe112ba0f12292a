/**
 * Test helper: the requirements of PDF/A-2 level B (ISO 19005-2:2011) that a file's objects show, each
 * checked on the parsed file (qpdf's JSON of every object, streams decoded), not by looking for marker
 * strings. No conformance validator installs from the package registries here, so each requirement is
 * written out; the clause numbers are from memory of ISO 19005-2 and say where to look. Returns one message
 * per breach, empty for a file that meets them all.
 *
 * Not covered (they need a renderer or a font parser): glyph widths in the font program against /W, the
 * content streams' operators, the ICC profile beyond its header.
 */
import { execFileSync } from 'node:child_process';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
interface Obj {
  value?: Json;
  stream?: { dict: Record<string, Json>; data?: string };
}

export function pdfaFindings(file: string): string[] {
  const raw = execFileSync('qpdf', ['--json=2', '--json-stream-data=inline', '--decode-level=generalized', file], {
    maxBuffer: 1 << 30,
    encoding: 'utf8',
  });
  const [head, objects] = (JSON.parse(raw) as { qpdf: [Record<string, Json>, Record<string, Obj>] }).qpdf;
  const out: string[] = [];
  const get = (ref: Json): Json => {
    if (typeof ref === 'string' && / R$/.test(ref)) {
      const o = objects[`obj:${ref}`];
      return o?.value ?? (o?.stream ? (o.stream.dict as Json) : null);
    }
    return ref;
  };
  const dict = (ref: Json): Record<string, Json> => {
    const v = get(ref);
    return v !== null && typeof v === 'object' && !Array.isArray(v) ? v : {};
  };
  const stream = (ref: Json): Buffer | null => {
    const o = typeof ref === 'string' ? objects[`obj:${ref}`] : undefined;
    return o?.stream?.data === undefined ? null : Buffer.from(o.stream.data, 'base64');
  };
  const text = (v: Json): string => {
    const s = typeof get(v) === 'string' ? (get(v) as string) : '';
    if (s.startsWith('u:')) return s.slice(2);
    if (s.startsWith('b:')) return Buffer.from(s.slice(2), 'hex').toString('latin1');
    return s;
  };

  // 6.1.2: a header of version 1.0–1.7, then a comment of at least four bytes above 127.
  const bytes = execFileSync('head', ['-c', '64', file]);
  const header = /^%PDF-1\.([0-7])\r?\n%([\x80-\xff]{4,})/.exec(bytes.toString('latin1'));
  if (!header) out.push('6.1.2: the header is not %PDF-1.0…1.7 followed by a binary comment');
  if (typeof head.pdfversion !== 'string' || !/^1\.[0-7]$/.test(head.pdfversion))
    out.push(`6.1.2: PDF version ${head.pdfversion}`);

  // 6.1.3: a file identifier; no encryption.
  const trailer = dict(objects.trailer?.value ?? null);
  if (!Array.isArray(trailer['/ID']) || trailer['/ID'].length !== 2) out.push('6.1.3: the trailer has no /ID');
  if (trailer['/Encrypt'] !== undefined) out.push('6.1.3: the file is encrypted');

  const catalog = dict(trailer['/Root']);
  // 6.6.2: an XMP metadata stream, not filtered, identifying PDF/A-2 level B.
  const metaRef = catalog['/Metadata'];
  const metaDict = dict(metaRef ?? null);
  const xmp = metaRef === undefined ? null : stream(metaRef);
  if (xmp === null) out.push('6.6.2: the catalog has no /Metadata stream');
  if (metaDict['/Filter'] !== undefined) out.push('6.6.2.1: the metadata stream is filtered');
  const xml = xmp?.toString('utf8') ?? '';
  const field = (re: RegExp): string | null => re.exec(xml)?.[1] ?? null;
  if (xmp !== null) {
    const wellFormed = execFileSync(
      'python3',
      [
        '-c',
        'import sys, xml.dom.minidom as m\ntry:\n m.parseString(sys.stdin.buffer.read()); print("ok")\nexcept Exception as e: print(e)',
      ],
      { input: xmp, encoding: 'utf8' },
    ).trim();
    if (wellFormed !== 'ok') out.push(`6.6.2: the XMP packet is not well-formed XML (${wellFormed})`);
    if (field(/<pdfaid:part>([^<]*)<\/pdfaid:part>/) !== '2') out.push('6.6.4: pdfaid:part is not 2');
    if (field(/<pdfaid:conformance>([^<]*)<\/pdfaid:conformance>/) !== 'B')
      out.push('6.6.4: pdfaid:conformance is not B');
  }

  // 6.6.3: every Info entry that has an XMP counterpart has the same value there.
  const info = dict(trailer['/Info'] ?? null);
  const xmlText = (s: string | null): string | null =>
    s === null
      ? null
      : s
          .replace(/&lt;/g, '<')
          .replace(/&gt;/g, '>')
          .replace(/&quot;/g, '"')
          .replace(/&apos;/g, "'")
          .replace(/&amp;/g, '&');
  const pairs: [string, RegExp][] = [
    ['/Title', /<dc:title>\s*<rdf:Alt>\s*<rdf:li xml:lang="x-default">([^<]*)</],
    ['/Author', /<dc:creator>\s*<rdf:Seq>\s*<rdf:li>([^<]*)</],
    ['/Subject', /<dc:description>\s*<rdf:Alt>\s*<rdf:li xml:lang="x-default">([^<]*)</],
    ['/Keywords', /<pdf:Keywords>([^<]*)</],
    ['/Creator', /<xmp:CreatorTool>([^<]*)</],
    ['/Producer', /<pdf:Producer>([^<]*)</],
  ];
  for (const [key, re] of pairs) {
    if (info[key] === undefined) continue;
    const inXmp = xmlText(field(re));
    if (inXmp !== text(info[key])) out.push(`6.6.3: Info ${key} "${text(info[key])}" but XMP has "${inXmp}"`);
  }
  const instant = (pdfDate: string): number => {
    const m = /^D:(\d{4})(\d{2})(\d{2})(\d{2})(\d{2})(\d{2})Z/.exec(pdfDate);
    return m ? Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]) : Number.NaN;
  };
  for (const [key, tag] of [
    ['/CreationDate', 'xmp:CreateDate'],
    ['/ModDate', 'xmp:ModifyDate'],
  ]) {
    if (info[key] === undefined) continue;
    const inXmp = Date.parse(field(new RegExp(`<${tag}>([^<]*)<`)) ?? '');
    if (!(instant(text(info[key])) === inXmp)) out.push(`6.6.3: Info ${key} and ${tag} are not the same instant`);
  }

  // 6.2.3–6.2.4: device colours need a PDF/A output intent whose profile is an RGB (or matching) ICC profile.
  const intents = (get(catalog['/OutputIntents'] ?? null) as Json[] | null) ?? [];
  const pdfa = intents.map(dict).filter((d) => d['/S'] === '/GTS_PDFA1');
  if (pdfa.length !== 1) out.push(`6.2.3: ${pdfa.length} PDF/A output intents, not one`);
  for (const intent of pdfa) {
    const profileRef = intent['/DestOutputProfile'];
    const icc = profileRef === undefined ? null : stream(profileRef);
    if (icc === null) {
      out.push('6.2.3: the output intent has no embedded ICC profile');
      continue;
    }
    // ICC.1:2010 §7.2: bytes 12–15 the device class, 16–19 the data colour space, 36–39 "acsp".
    if (icc.subarray(36, 40).toString('latin1') !== 'acsp') out.push('6.2.3: the output profile is not an ICC profile');
    const space = icc.subarray(16, 20).toString('latin1');
    const n = dict(profileRef ?? null)['/N'];
    if (space !== 'RGB ' || n !== 3) out.push(`6.2.3: the output profile is ${space.trim()} with /N ${n}, not RGB`);
    if (!['mntr', 'prtr', 'scnr'].includes(icc.subarray(12, 16).toString('latin1')))
      out.push('6.2.3: the output profile is not an output device profile');
  }

  for (const [key, o] of Object.entries(objects)) {
    if (!key.startsWith('obj:')) continue;
    const d = (o.value !== null && typeof o.value === 'object' && !Array.isArray(o.value) ? o.value : o.stream?.dict) as
      | Record<string, Json>
      | undefined;
    if (!d) continue;
    const where = key.slice(4);
    // 6.1.7: no external stream data, no LZW.
    if (o.stream && (d['/F'] !== undefined || d['/FFilter'] !== undefined))
      out.push(`6.1.7: ${where} has external data`);
    const filters = [d['/Filter']].flat();
    if (filters.includes('/LZWDecode')) out.push(`6.1.7: ${where} uses LZWDecode`);
    // 6.2.11.4: every font program embedded.
    if (d['/Type'] === '/FontDescriptor' && !['/FontFile', '/FontFile2', '/FontFile3'].some((k) => d[k] !== undefined))
      out.push(`6.2.11.4: font ${text(d['/FontName'])} is not embedded`);
    if (d['/Type'] === '/Font' && ['/Type1', '/TrueType', '/MMType1'].includes(d['/Subtype'] as string)) {
      if (d['/FontDescriptor'] === undefined)
        out.push(`6.2.11.4: simple font ${text(d['/BaseFont'])} has no descriptor`);
    }
    // 6.2.11.3.2: a CIDFontType2 maps CIDs to glyphs.
    if (d['/Subtype'] === '/CIDFontType2' && d['/CIDToGIDMap'] === undefined)
      out.push(`6.2.11.3.2: CID font ${text(d['/BaseFont'])} has no /CIDToGIDMap`);
    // 6.2.5: no transfer functions or halftones with their own transfer; standard blend modes only.
    if (d['/Type'] === '/ExtGState') {
      if (d['/TR'] !== undefined) out.push(`6.2.5: ${where} has a transfer function /TR`);
      if (d['/TR2'] !== undefined && d['/TR2'] !== '/Default') out.push(`6.2.5: ${where} has /TR2`);
      if (d['/HTP'] !== undefined) out.push(`6.2.5: ${where} has /HTP`);
      const bm = [d['/BM']].flat().filter((x) => x !== undefined);
      const standard = ['/Normal', '/Compatible', '/Multiply', '/Screen', '/Overlay', '/Darken', '/Lighten'];
      const more = ['/ColorDodge', '/ColorBurn', '/HardLight', '/SoftLight', '/Difference', '/Exclusion'];
      const nonSeparable = ['/Hue', '/Saturation', '/Color', '/Luminosity'];
      for (const m of bm)
        if (![...standard, ...more, ...nonSeparable].includes(m as string))
          out.push(`6.2.10: ${where} has blend mode ${m}`);
    }
    // 6.2.8: images: no alternates, no OPI, no interpolation.
    if (d['/Subtype'] === '/Image') {
      if (d['/Alternates'] !== undefined) out.push(`6.2.8: image ${where} has /Alternates`);
      if (d['/OPI'] !== undefined) out.push(`6.2.8: image ${where} has /OPI`);
      if (d['/Interpolate'] === true) out.push(`6.2.8: image ${where} is interpolated`);
    }
    // 6.2.9: no PostScript XObjects.
    if (d['/Subtype'] === '/PS' || d['/Subtype2'] === '/PS') out.push(`6.2.9: ${where} is a PostScript XObject`);
    // 6.5–6.6: no JavaScript, no launch, sound or movie actions, no additional actions on the catalog or pages.
    if (d['/S'] === '/JavaScript' || d['/JS'] !== undefined) out.push(`6.6.1: ${where} is JavaScript`);
    if (['/Launch', '/Sound', '/Movie', '/ResetForm', '/ImportData'].includes(d['/S'] as string))
      out.push(`6.6.1: ${where} is a ${d['/S']} action`);
    if ((d['/Type'] === '/Catalog' || d['/Type'] === '/Page') && d['/AA'] !== undefined)
      out.push(`6.6.2: ${d['/Type']} ${where} has additional actions`);
    // 6.3.2–6.3.3: annotations of permitted kinds, printed, with appearances.
    if (d['/Type'] === '/Annot' || (d['/Subtype'] !== undefined && d['/Rect'] !== undefined && d['/P'] !== undefined)) {
      if (['/Sound', '/Movie', '/FileAttachment', '/3D', '/RichMedia'].includes(d['/Subtype'] as string))
        out.push(`6.3.1: annotation ${where} is ${d['/Subtype']}`);
      const flags = typeof d['/F'] === 'number' ? d['/F'] : 0;
      if ((flags & 4) === 0 && d['/Subtype'] !== '/Popup') out.push(`6.3.2: annotation ${where} is not printed`);
    }
  }
  // 6.8: no embedded files (that are not themselves PDF/A); a brief embeds none.
  const names = dict(catalog['/Names'] ?? null);
  if (names['/EmbeddedFiles'] !== undefined) out.push('6.8: the file has embedded files');
  return out;
}
