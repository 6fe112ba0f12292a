/**
 * Partial sort in the manner of Singleton's quicksort (R. C. Singleton 1969, "Algorithm 347: An efficient
 * algorithm for sorting with minimal storage", Communications of the ACM 12(3), 185–186), stopping work on
 * any segment that holds none of the wanted positions. STL's reference implementation (the Fortran shipped
 * with R's stats::stl) finds the median absolute residual this way, asking for positions n/2 + 1 and
 * n − (n/2 + 1) + 1 — in descending order, which the method does not expect, so for some inputs the value
 * left at a wanted position is not that order statistic. We follow the same steps so that robust STL agrees
 * with R to rounding; `trueMedian` in stl.ts gives the textbook median instead.
 *
 * `positions` are 1-based, in the order given; `a` is rearranged in place.
 */
export function partialSort(a: Float64Array, positions: readonly number[]): void {
  const n = a.length;
  const ni = positions.length;
  if (n < 2 || ni === 0) return;
  // Indices stay 1-based, as in the published algorithm, so every access reads a[k − 1]: written out rather
  // than through helper closures, whose calls are costly until the engine has compiled this function.
  const indu = new Int32Array(17);
  const indl = new Int32Array(17);
  const iu = new Int32Array(17);
  const il = new Int32Array(17);
  let jl = 1;
  let ju = ni;
  indl[1] = 1;
  indu[1] = ni;
  let i = 1;
  let j = n;
  let m = 1;
  let k = 0;
  let l = 0;
  let t = 0;
  // States of the published flow chart: 'outer' tests a segment, 'pop' takes the next one from the stack,
  // 'loop' partitions while the segment is longer than 11, 'small' finishes it by straight insertion.
  let state: 'outer' | 'pop' | 'loop' | 'split' | 'small' = 'outer';
  for (;;) {
    if (state === 'outer') {
      state = i < j ? 'split' : 'pop';
    } else if (state === 'pop') {
      m--;
      if (m === 0) return;
      i = il[m];
      j = iu[m];
      jl = indl[m];
      ju = indu[m];
      state = jl <= ju ? 'loop' : 'pop';
    } else if (state === 'loop') {
      state = j - i > 10 ? 'split' : 'small';
    } else if (state === 'split') {
      k = i;
      const ij = (i + j) >> 1;
      t = a[ij - 1];
      if (a[i - 1] > t) {
        a[ij - 1] = a[i - 1];
        a[i - 1] = t;
        t = a[ij - 1];
      }
      l = j;
      if (a[j - 1] < t) {
        a[ij - 1] = a[j - 1];
        a[j - 1] = t;
        t = a[ij - 1];
        if (a[i - 1] > t) {
          a[ij - 1] = a[i - 1];
          a[i - 1] = t;
          t = a[ij - 1];
        }
      }
      for (;;) {
        l--;
        if (a[l - 1] <= t) {
          const tt = a[l - 1];
          do k++;
          while (!(a[k - 1] >= t));
          if (k > l) break;
          a[l - 1] = a[k - 1];
          a[k - 1] = tt;
        }
      }
      indl[m] = jl;
      indu[m] = ju;
      const p = m;
      m++;
      let popped = false;
      if (l - i <= j - k) {
        il[p] = k;
        iu[p] = j;
        j = l;
        for (;;) {
          if (jl > ju) {
            popped = true;
            break;
          }
          if (positions[ju - 1] > j) ju--;
          else break;
        }
        if (!popped) indl[p] = ju + 1;
      } else {
        il[p] = i;
        iu[p] = l;
        i = k;
        for (;;) {
          if (jl > ju) {
            popped = true;
            break;
          }
          if (positions[jl - 1] < i) jl++;
          else break;
        }
        if (!popped) indu[p] = jl - 1;
      }
      state = popped ? 'pop' : 'loop';
    } else {
      // 'small': straight insertion, only for segments that do not start at 1 (a(i−1) is a sentinel).
      if (i !== 1) {
        i--;
        let done = false;
        while (!done) {
          i++;
          if (i === j) {
            done = true;
            break;
          }
          const v = a[i];
          if (a[i - 1] > v) {
            let q = i;
            do {
              a[q] = a[q - 1];
              q--;
            } while (!(v >= a[q - 1]));
            a[q] = v;
          }
        }
        state = 'pop';
      } else state = 'outer';
    }
  }
}
