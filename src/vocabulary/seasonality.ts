/**
 * The results of the seasonality tests the diagnose stage runs and the Brief carries: the F-tests for
 * stable and moving seasonality, the Kruskal-Wallis test, the combined identifiable-seasonality verdict
 * and the residual-seasonality test on the adjusted series. Types only; the tests are in src/diagnose/.
 */

/** An F-test's statistic, degrees of freedom and upper-tail probability. */
export interface FTest {
  statistic: number;
  df1: number;
  df2: number;
  pValue: number;
}

/** A chi-square test's statistic, degrees of freedom and upper-tail probability. */
export interface ChiSquareTest {
  statistic: number;
  df: number;
  pValue: number;
}

export type IdentifiableVerdict = 'present' | 'probably-none' | 'none';

export interface IdentifiableSeasonality {
  period: number;
  /** The SI values tested: first and last index with a value, and how many. */
  from: number;
  to: number;
  count: number;
  stable: FTest;
  moving: FTest;
  kruskalWallis: ChiSquareTest;
  t1: number;
  t2: number;
  /** √((T1 + T2) / 2); NaN when T2 is. */
  m7: number;
  verdict: IdentifiableVerdict;
  /** The step that decided: 'stable', 'moving', 't1', 't2', 'kruskal-wallis' or 'all' (present). */
  decidedBy: 'stable' | 'moving' | 't1' | 't2' | 'kruskal-wallis' | 'all';
  /** The levels each step was judged at. */
  levels: { readonly stable: number; readonly moving: number; readonly kruskalWallis: number };
}

export interface ResidualSeasonality {
  statistic: number;
  df1: number;
  df2: number;
  pValue: number;
  present: boolean;
  test: string;
  /** The level the test is judged at. */
  level: number;
  /** Most whole cycles of changes judged (the last ones). */
  cycles: number;
}
