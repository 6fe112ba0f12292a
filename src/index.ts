/**
 * The programmatic API. Charts: chartSpec and chartSpecOf give the vega-lite spec of any chart of a brief's
 * series, generated from the marks the brief draws; renderChartSpec draws such a spec with vega.
 */

export { type ChartKind, chartSpec, chartSpecOf } from './chart/index.js';
export { type RenderedSvg, renderChartSpec, type SvgLabel } from './chart/spec-svg.js';
export type { Chart, SeriesBrief } from './vocabulary/brief.js';
export type { Scene } from './vocabulary/scene.js';
