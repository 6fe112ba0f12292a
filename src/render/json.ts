/**
 * The Brief model as JSON: NaN becomes null (JSON.stringify's own rule), chart SVG and scenes are left out (the HTML
 * and PDF carry it), keys in the model's order, so two runs with SOURCE_DATE_EPOCH set give the same bytes.
 */
import type { Brief } from '../brief/model.js';

export function renderJson(brief: Brief): string {
  const plain = {
    ...brief,
    series: brief.series.map((s) => ({ ...s, charts: s.charts.map(({ svg: _svg, scene: _scene, ...rest }) => rest) })),
  };
  return `${JSON.stringify(plain, null, 2)}\n`;
}
