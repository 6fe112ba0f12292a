/**
 * The PDF brief's walk of the document (src/document/): each section as a tagged Sect (with a bookmark
 * when it has an outline entry), each block drawn by its kind. What is drawn and in which order is the
 * document's; this file decides only how each block looks on the page and where pages break.
 */
import type { Block, HeadingBlock, SectionBlock, TableBlock } from '../../document/blocks.js';
import { drawCautions } from './back-matter.js';
import { drawChart } from './charts.js';
import { drawKeyFigures } from './key-figures.js';
import { atPageTop, ensure, type Flow, heading, newPage, paragraph, rule, space, textHeight } from './layout.js';
import { drawContents, drawMasthead } from './masthead.js';
import { drawOverview, overviewHeight } from './overview.js';
import { drawHeadline, seriesHeading } from './series.js';
import { drawTable, type TableOptions } from './tables.js';
import { artifact, group, type Struct } from './tags.js';

/** Room for the overview's heading and note above its table, in points. */
const OVERVIEW_HEADING = 90;

/** What came before a section on the page, which decides whether it starts a page of its own. */
export interface WalkState {
  previous: string | null;
}

export function drawSection(flow: Flow, parent: Struct, section: SectionBlock, state: WalkState): void {
  const { doc } = flow;
  // A series starts a page of its own unless only the masthead is above it (a one-series brief's page 1).
  const breakBefore = section.newPage || (section.name === 'series' && state.previous !== 'masthead');
  if (breakBefore && state.previous !== null && !atPageTop(flow)) newPage(flow);
  state.previous = section.name;
  if (section.name === 'masthead' || section.name === 'contents' || section.name === 'cautions') {
    // Tagged by their own drawers (the masthead's parts sit on the root, as in the HTML's header).
    for (const b of section.blocks) drawBlock(flow, parent, b, section.name);
    return;
  }
  const overview = section.blocks.find((b) => b.kind === 'overview');
  if (overview) {
    // The overview is read as one page: it starts on a new one unless it fits whole below the cursor.
    const height = OVERVIEW_HEADING + overviewHeight(flow, overview);
    if (height <= flow.geo.bodyBottom - flow.geo.bodyTop) ensure(flow, height);
  }
  const sect = group(doc, parent, 'Sect');
  if (section.outline && section.name !== 'appendix appendix-method' && section.name !== 'appendix appendix-data')
    doc.outline.addItem(section.outline);
  for (const b of section.blocks) drawBlock(flow, sect, b, section.name);
  sect.end();
}

function drawBlock(flow: Flow, parent: Struct, b: Block, within: string): void {
  const { theme } = flow;
  switch (b.kind) {
    case 'section':
      if (b.name === 'appendix-series' || b.name === 'appendix-run') {
        if (b.newPage) newPage(flow);
        else space(flow, 8);
        const part = group(flow.doc, parent, 'Sect');
        for (const inner of b.blocks) drawBlock(flow, part, inner, b.name);
        part.end();
      } else {
        // A series' subsection (comparisons, unusual periods, firmness): its heading keeps what follows.
        const part = group(flow.doc, parent, 'Sect');
        space(flow, 16);
        for (const inner of b.blocks) drawBlock(flow, part, inner, b.name);
        part.end();
      }
      return;
    case 'masthead':
      drawMasthead(flow, parent, b);
      return;
    case 'contents':
      drawContents(flow, parent, b);
      return;
    case 'heading':
      drawHeading(flow, parent, b, within);
      return;
    case 'headline':
      drawHeadline(flow, parent, b.text);
      return;
    case 'statements':
      for (const st of b.items) paragraph(flow, parent, st.text, theme.body, { spaceAfter: 6 });
      return;
    case 'key-figures':
      drawKeyFigures(flow, parent, b.items);
      space(flow, 6);
      return;
    case 'figures':
      space(flow, 10);
      for (const chart of b.charts) drawChart(flow, parent, chart);
      return;
    case 'table':
      drawTable(flow, parent, b, tableOptions(flow, b));
      return;
    case 'facts': {
      // Keep the title with the rows its table keeps together at its start (three, tables.ts): a long
      // source wraps to several lines in the narrow column, and the title must not stay behind alone.
      const lead = b.items
        .slice(0, 3)
        .reduce(
          (a, x) =>
            a +
            Math.max(
              textHeight(flow.doc, theme.small, x.label, flow.geo.column * 0.35),
              textHeight(flow.doc, theme.small, x.value, flow.geo.column * 0.55),
            ) +
            6,
          0,
        );
      if (b.title) heading(flow, parent, 4, b.title, theme.h4, Math.max(30, lead), 3);
      drawTable(
        flow,
        parent,
        { caption: '', headers: ['', ''], numeric: [false, false], rows: b.items.map((x) => [x.label, x.value]) },
        { sizes: theme.tableSizes, header: false, fractions: [0.4, 0.6], labelColour: theme.muted, spaceAfter: 10 },
      );
      return;
    }
    case 'note':
      paragraph(flow, parent, b.text, { ...theme.small, lineGap: 0 }, { spaceAfter: 8 });
      return;
    case 'cautions':
      drawCautions(flow, parent, b.title, b.items);
      return;
    case 'overview':
      drawOverview(flow, parent, b);
      return;
  }
}

function drawHeading(flow: Flow, parent: Struct, b: HeadingBlock, within: string): void {
  const { doc, geo, theme } = flow;
  if (b.level === 2 && within === 'series') {
    seriesHeading(flow, parent, b.text, b.unit);
    return;
  }
  if (b.level === 2) {
    // An appendix or the overview: a hairline above unless at the top of a page, and a bookmark.
    space(flow, 20);
    // The data appendix's heading keeps its series heading, note and the table's first rows (about 200 pt),
    // so the table never starts on the next page with the headings left behind.
    ensure(flow, within === 'appendix appendix-data' ? 200 : 120);
    if (flow.y > geo.bodyTop + 0.01) {
      const y = flow.y;
      artifact(doc, () => rule(doc, geo.left, y, geo.column, theme.rule, 0.75));
      flow.y += 8;
    }
    if (within.startsWith('appendix')) doc.outline.addItem(b.text);
    heading(flow, parent, 2, b.text, theme.h2, 60, 8);
    return;
  }
  if (b.level === 3) {
    const subsection = within === 'comparisons' || within === 'unusual' || within === 'firmness';
    heading(flow, parent, 3, b.text, theme.h3, subsection ? 3 * 14 : 60, 5);
    return;
  }
  heading(flow, parent, 4, b.text, theme.h4, 30, 3);
}

function tableOptions(flow: Flow, b: TableBlock): TableOptions {
  const { theme } = flow;
  if (b.role === 'method') return { sizes: theme.tableSizes, fractions: [0.4, 0.6], labelColour: theme.muted };
  if (b.role === 'data') return { sizes: theme.dataTableSizes, padY: 1.2 };
  return { sizes: theme.tableSizes, keepTogether: b.keepTogether };
}
