/**
 * A chart's vega-lite spec drawn by vega, for the programmatic API (src/index.ts). vega is loaded only
 * when this is called, so importing the API, or drawing a brief, never loads it.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { RenderedSvg, SvgLabel } from './svg.js';

export type { RenderedSvg, SvgLabel };

/** A vega-lite spec (from chartSpec, edited or not) as a labelled static SVG. */
export async function renderChartSpec(spec: TopLevelSpec, label: SvgLabel): Promise<RenderedSvg> {
  const { renderSvg } = await import('./svg.js');
  return renderSvg(spec, label);
}
