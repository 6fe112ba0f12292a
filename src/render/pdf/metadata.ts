/**
 * Document metadata: the Info dictionary and the XMP packet (ISO 16684-1) that must agree with it for
 * PDF/A. Both dates are the brief's generation time, which honours SOURCE_DATE_EPOCH, and pdfkit derives the
 * trailer /ID from the Info entries, so the same brief always gives the same file.
 */
import type { HeadView } from '../../document/view.js';

export function documentInfo(view: HeadView): PDFKit.DocumentInfo {
  const date = new Date(view.generatedIso);
  const labels = view.series.map((s) => s.label);
  const periods = [...new Set(view.series.map((s) => s.reportingPeriod))];
  const info: PDFKit.DocumentInfo = {
    Title: view.title,
    Subject: `${labels.join(', ')}: trend, season and change, ${periods.join(', ')}`,
    Keywords: unique(['trend', 'seasonal adjustment', 'year-over-year change', ...labels, view.organisation]).join(
      ', ',
    ),
    Creator: `trendbrief ${view.toolVersion}`,
    Producer: 'PDFKit',
    CreationDate: date,
    ModDate: date,
  };
  const author = view.author || view.organisation;
  if (author) info.Author = author;
  return info;
}

/**
 * Completes the XMP packet pdfkit writes with the modification date and the language, which it leaves out
 * (the Info strings it copies in are escaped by document.ts).
 */
export function completeXmp(doc: PDFKit.PDFDocument, view: HeadView): void {
  const date = `${new Date(view.generatedIso).toISOString().split('.')[0]}Z`;
  doc.appendXML(`
        <rdf:Description rdf:about="" xmlns:xmp="http://ns.adobe.com/xap/1.0/">
            <xmp:ModifyDate>${date}</xmp:ModifyDate>
            <xmp:MetadataDate>${date}</xmp:MetadataDate>
        </rdf:Description>
        <rdf:Description rdf:about="" xmlns:dc="http://purl.org/dc/elements/1.1/">
            <dc:language><rdf:Bag><rdf:li>${escapeXml(view.lang)}</rdf:li></rdf:Bag></dc:language>
        </rdf:Description>`);
}

export function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

function unique(list: string[]): string[] {
  return [...new Set(list.filter((x) => x !== ''))];
}
