/**
 * What the comparisons chart (scenes/comparisons.ts) and its alt text share: each comparison is a pair of
 * bars, baseline then current, drawn relative to the larger of the two; panels are titled by the label.
 */
import type { Comparison, PeriodSpan } from '../vocabulary/brief.js';
import type { Frequency } from '../vocabulary/period-index.js';
import { formatSpanLabel } from './format.js';

export const BASELINE = 'baseline';
export const CURRENT = 'current';

/** "Sept 2026", "Jul–Sept 2026", or "Oct 25 – Sept 26" for a span across years. */
export function spanText(span: PeriodSpan, frequency: Frequency, locale: string): string {
  return formatSpanLabel(span.ordinals, frequency, locale);
}

/** Panel titles must be distinct for the facet; a repeated label gets its position appended. */
export function panelTitles(comparisons: Comparison[]): string[] {
  const seen = new Set<string>();
  return comparisons.map((c, i) => {
    const title = seen.has(c.label) ? `${c.label} (${i + 1})` : c.label;
    seen.add(title);
    return title;
  });
}

/** The two values of a comparison over the larger magnitude of the pair (NaN stays null: no bar). */
export function relativeHeights(current: number, baseline: number): [number | null, number | null] {
  const scale = Math.max(
    Number.isFinite(current) ? Math.abs(current) : 0,
    Number.isFinite(baseline) ? Math.abs(baseline) : 0,
  );
  const rel = (v: number) => (Number.isFinite(v) ? (scale > 0 ? v / scale : 0) : null);
  return [rel(current), rel(baseline)];
}
