/**
 * The main loop of the variable-metric minimiser (Nash, Compact Numerical Methods for Computers, 2nd ed.
 * (1990), Algorithm 21, R's vmmin; Fletcher (1970), Computer Journal 13(3), 317–322 for the update) as a
 * WebAssembly kernel, written in AssemblyScript and compiled by `npm run build` (scripts/kernels.mjs) into
 * dist/model/bfgs-kernel.wasm. It is the loop of bfgs.ts (vmminScript) step for step: the same IEEE double
 * operations in the same order, so it gives the same bits (test/model/bfgs.test.ts). The objective and its
 * gradient stay in JavaScript (the imports below, which the loader binds to the search of the moment); what
 * runs here is the line search and the update of the inverse Hessian, which in JavaScript ran interpreted for
 * the first tens of fits of a fresh process and boxed every intermediate double.
 *
 * Memory: the loader (bfgs.ts) places the arrays from base() up and grows the memory; nothing is allocated.
 */

// The objective at the point b, and its gradient at b into g (f(b) = fAt, already known): bound by the loader.
declare function value(): f64;
declare function gradient(fAt: f64): void;

function ld(base: usize, i: i32): f64 {
  return load<f64>(base + ((<usize>i) << 3));
}

function st(base: usize, i: i32, v: f64): void {
  store<f64>(base + ((<usize>i) << 3), v);
}

function copy(to: usize, from: usize, len: i32): void {
  memory.copy(to, from, (<usize>len) << 3);
}

let iterations: i32 = 0;

/** The iteration count of the last minimise. */
export function iterationsDone(): i32 {
  return iterations;
}

/** Where the loader's layout may start: after the kernel's own static data. */
export function base(): usize {
  return (__heap_base + 15) & ~(<usize>15);
}

/**
 * From the point b (n parameters, in scaled units), its value fmin and its gradient g: vmmin's iterations,
 * leaving the minimum in b; returns its value. B (n × n), X, c and t are scratch.
 */
export function minimise(
  n: i32,
  fmin: f64,
  maxit: i32,
  relTol: f64,
  b: usize,
  g: usize,
  B: usize,
  X: usize,
  c: usize,
  t: usize,
): f64 {
  let iter = 1;
  let gradcount = 1;
  let ilast = gradcount;
  let count = 0;
  const reltest: f64 = 10;
  const acctol: f64 = 1e-4;
  do {
    if (ilast === gradcount) {
      for (let i = 0; i < n * n; i++) st(B, i, 0);
      for (let i = 0; i < n; i++) st(B, i * n + i, 1);
    }
    copy(X, b, n);
    copy(c, g, n);
    let gradproj: f64 = 0;
    for (let i = 0; i < n; i++) {
      let s: f64 = 0;
      for (let j = 0; j < n; j++) s -= ld(B, i * n + j) * ld(g, j);
      st(t, i, s);
      gradproj += s * ld(g, i);
    }
    if (gradproj < 0) {
      let steplength: f64 = 1;
      let accpoint = false;
      let fv = fmin;
      do {
        count = 0;
        for (let i = 0; i < n; i++) {
          const bi = ld(X, i) + steplength * ld(t, i);
          st(b, i, bi);
          if (reltest + ld(X, i) === reltest + bi) count++;
        }
        if (count < n) {
          fv = value();
          accpoint = fv <= fmin + gradproj * steplength * acctol;
          if (!accpoint) steplength *= 0.2;
        }
      } while (!(count === n || accpoint));
      const enough = Math.abs(fv - fmin) > relTol * (Math.abs(fmin) + relTol);
      if (!enough) {
        count = n;
        if (fv < fmin) fmin = fv;
        else copy(b, X, n);
      }
      if (count < n) {
        fmin = fv;
        gradient(fv);
        gradcount++;
        iter++;
        let D1: f64 = 0;
        for (let i = 0; i < n; i++) {
          const ti = ld(t, i) * steplength;
          st(t, i, ti);
          const ci = ld(g, i) - ld(c, i);
          st(c, i, ci);
          D1 += ti * ci;
        }
        if (D1 > 0) {
          let D2: f64 = 0;
          for (let i = 0; i < n; i++) {
            let s: f64 = 0;
            for (let j = 0; j < n; j++) s += ld(B, i * n + j) * ld(c, j);
            st(X, i, s);
            D2 += s * ld(c, i);
          }
          D2 = 1 + D2 / D1;
          for (let i = 0; i < n; i++)
            for (let j = 0; j < n; j++)
              st(
                B,
                i * n + j,
                ld(B, i * n + j) + (D2 * ld(t, i) * ld(t, j) - ld(X, i) * ld(t, j) - ld(t, i) * ld(X, j)) / D1,
              );
        } else {
          ilast = gradcount;
        }
      } else if (ilast < gradcount) {
        count = 0;
        ilast = gradcount;
      }
    } else {
      count = 0;
      if (ilast === gradcount) count = n;
      else ilast = gradcount;
    }
    if (iter >= maxit) break;
    if (gradcount - ilast > 2 * n) ilast = gradcount;
  } while (count !== n || ilast !== gradcount);
  iterations = iter;
  return fmin;
}
