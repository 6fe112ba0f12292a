/** What every decomposition method returns, whatever the job asked for. */
export interface DecomposeOutput {
  trend: Float64Array;
  seasonal: Float64Array;
  remainder: Float64Array;
  /** observed − seasonal, or observed / seasonal. */
  adjusted: Float64Array;
  /** MSTL: each period's seasonal component. */
  seasonals: Map<number, Float64Array> | null;
  /** Robust STL weights, or null. */
  weights: Float64Array | null;
  /** How many of the last trend values rest on end (asymmetric) weights. */
  provisionalCount: number;
}
