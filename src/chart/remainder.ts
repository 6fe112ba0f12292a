/**
 * The remainder as stems from the centre line (0 for an additive model, 1 for a multiplicative one, where the
 * remainder is a ratio), with unusual values (diagnostics.outliers) drawn as larger diamonds in another colour
 * and labelled with their period.
 */
import type { SeriesBrief } from '../vocabulary/brief.js';

export const USUAL = 'within the usual range';
export const UNUSUAL = 'unusual value';
/** More labels than this crowd the strip; the largest by score keep theirs, every one keeps its diamond. */
export const MAX_LABELS = 10;

/** The remainder's neutral value: no departure from trend and season. */
export function remainderCentre(series: SeriesBrief): number {
  return series.settings.model === 'multiplicative' ? 1 : 0;
}
