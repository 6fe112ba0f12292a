/**
 * Denton's proportional first-difference benchmarking, in its modified form without a constraint on the
 * first period: the series x closest to an indicator i in the sense
 *
 *   minimise Σ_{t=2..n} (x_t / i_t − x_{t−1} / i_{t−1})²   subject to   Σ_{t∈b} x_t = A_b for every block b,
 *
 * where the blocks are runs of consecutive periods (the whole years) and A_b their benchmarks (the raw
 * yearly totals). Periods outside every block are left free, so a year only partly in the data is not
 * constrained: the ratio x/i is carried flat from the nearest whole year (extrapolation, not benchmarking).
 *
 * Source: Denton, F. T. (1971), "Adjustment of monthly or quarterly series to annual totals: an approach
 * based on quadratic minimization", Journal of the American Statistical Association 66(333), 99–102 (the
 * proportional first-difference penalty); the modified form, without Denton's fixed starting value, as in
 * the IMF's Quarterly National Accounts Manual, 2017 edition, chapter 6 (benchmarking), which also gives the
 * extrapolation of incomplete years by the last benchmark-to-indicator ratio. Agrees with statsmodels'
 * `dentonm` (test/adjust/denton.test.ts).
 *
 * How it is solved (O(n + m³) for n periods and m blocks, so hourly series of decades stay cheap): with
 * r_t = x_t / i_t, the stationarity conditions make r's second difference equal λ_b·i_t inside block b and
 * zero elsewhere, with zero slope at both ends. So r_t = r_1 − Σ_{k<t} (t − k)·λ_{b(k)}·i_k, and r_1 and the
 * λ_b follow from the m block sums and Σ_b λ_b·I_b = 0 (I_b = Σ_{t∈b} i_t): an (m+1)-square system.
 *
 *   indicator [1, 1, 1, 1], one block over all four with total 8 → [2, 2, 2, 2] (the ratio 2 everywhere)
 *   indicator [1, 1, 1], blocks [0, 0, −1], total 4 → [2, 2, 2] (the free last period carries the ratio on)
 *
 * `block[t]` is the block of period t (0, 1, … in time order, each a consecutive run) or −1 for a free
 * period. The result is NaN everywhere when no block is given, when an indicator inside a block is not a
 * positive number (a ratio to it means nothing) or a total is not finite; a free period whose indicator is
 * missing is NaN in the result.
 */
export function dentonProportional(indicator: Float64Array, block: Int32Array, totals: Float64Array): Float64Array {
  const n = indicator.length;
  const m = totals.length;
  const out = new Float64Array(n).fill(Number.NaN);
  if (m === 0 || block.length !== n) return out;
  // Each block's first and last period, its indicator sum and centroid (in time measured from its start).
  const first = new Int32Array(m).fill(-1);
  const last = new Int32Array(m).fill(-1);
  let scale = 0;
  let count = 0;
  for (let t = 0; t < n; t++) {
    const b = block[t];
    if (b < 0) continue;
    if (b >= m || !(indicator[t] > 0) || !Number.isFinite(indicator[t])) return out;
    if (first[b] < 0) first[b] = t;
    else if (last[b] !== t - 1) return out; // a block must be one run
    last[b] = t;
    scale += indicator[t];
    count++;
  }
  for (let b = 0; b < m; b++) if (first[b] < 0 || !Number.isFinite(totals[b])) return out;
  // Work with the indicator scaled to a mean of 1, so the system's entries do not depend on the units.
  scale /= count;
  const ind = (t: number) => indicator[t] / scale;
  const sums = new Float64Array(m);
  const centroid = new Float64Array(m); // Σ t·i_t / I_b, absolute time
  const own = new Float64Array(m); // Σ_{t∈b} i_t Σ_{k∈b, k<t} (t − k) i_k
  for (let b = 0; b < m; b++) {
    let s0 = 0;
    let s1 = 0;
    let q = 0;
    for (let t = first[b]; t <= last[b]; t++) {
      const local = t - first[b];
      q += ind(t) * (local * s0 - s1);
      s0 += ind(t);
      s1 += local * ind(t);
    }
    sums[b] = s0;
    centroid[b] = first[b] + s1 / s0;
    own[b] = q;
  }
  // Unknowns: u = [r_1, λ_0 … λ_{m−1}]. Row 0: Σ λ_b I_b = 0. Row 1 + c: r_1 I_c − Σ_b λ_b Q_cb = A_c / scale,
  // with Q_cb = I_b I_c (centroid_c − centroid_b) for a block b before c, Q_cc = own[c], 0 for b after c.
  const size = m + 1;
  const a = new Float64Array(size * size);
  const rhs = new Float64Array(size);
  for (let b = 0; b < m; b++) a[1 + b] = sums[b];
  for (let c = 0; c < m; c++) {
    const row = (1 + c) * size;
    a[row] = sums[c];
    for (let b = 0; b < c; b++) a[row + 1 + b] = -sums[b] * sums[c] * (centroid[c] - centroid[b]);
    a[row + 1 + c] = -own[c];
    rhs[1 + c] = totals[c] / scale;
  }
  const u = solveEquilibrated(a, rhs, size);
  if (u === null) return out;
  // r_t = r_1 − H_t, H_{t+1} = H_t + G_{t+1}, G_{t+1} = Σ_{k≤t} λ_{b(k)} i_k.
  let g = 0;
  let h = 0;
  for (let t = 0; t < n; t++) {
    const r = u[0] - h;
    out[t] = indicator[t] * r;
    const b = block[t];
    if (b >= 0) g += u[1 + b] * ind(t);
    h += g;
  }
  return out;
}

/**
 * Solves a·x = rhs (row-major, size × size) by Gaussian elimination with partial pivoting after scaling
 * each column to a largest entry of 1 (the r_1 column holds sums of the indicator, the λ columns sums of
 * its products with distances, orders of magnitude apart). Null when the matrix is singular.
 */
function solveEquilibrated(a: Float64Array, rhs: Float64Array, size: number): Float64Array | null {
  const colScale = new Float64Array(size);
  for (let j = 0; j < size; j++) {
    let big = 0;
    for (let i = 0; i < size; i++) big = Math.max(big, Math.abs(a[i * size + j]));
    if (big === 0) return null;
    colScale[j] = big;
    for (let i = 0; i < size; i++) a[i * size + j] /= big;
  }
  const b = Float64Array.from(rhs);
  for (let k = 0; k < size; k++) {
    let p = k;
    for (let i = k + 1; i < size; i++) if (Math.abs(a[i * size + k]) > Math.abs(a[p * size + k])) p = i;
    if (a[p * size + k] === 0) return null;
    if (p !== k) {
      for (let j = 0; j < size; j++) {
        const x = a[k * size + j];
        a[k * size + j] = a[p * size + j];
        a[p * size + j] = x;
      }
      const x = b[k];
      b[k] = b[p];
      b[p] = x;
    }
    for (let i = k + 1; i < size; i++) {
      const f = a[i * size + k] / a[k * size + k];
      if (f === 0) continue;
      for (let j = k; j < size; j++) a[i * size + j] -= f * a[k * size + j];
      b[i] -= f * b[k];
    }
  }
  const x = new Float64Array(size);
  for (let i = size - 1; i >= 0; i--) {
    let s = b[i];
    for (let j = i + 1; j < size; j++) s -= a[i * size + j] * x[j];
    x[i] = s / a[i * size + i];
  }
  for (let j = 0; j < size; j++) x[j] /= colScale[j];
  return x;
}
