/**
 * Minimises a smooth function by the BFGS variable-metric method with a backtracking line search, the
 * gradient by central differences (or forward ones, or exact partial derivatives where the caller has them). Source: Nash, Compact Numerical Methods for Computers, 2nd ed. (1990),
 * Algorithm 21 (the variable-metric minimiser R's optim uses for method "BFGS", vmmin); Fletcher (1970),
 * Computer Journal 13(3), 317–322 for the update. Parameters are searched in units of `scale`.
 *
 *   bfgs(([x, y]) => (x − 1)² + 10(y + 2)², [0, 0]) → par ≈ [1, −2]
 */
export interface BfgsOptions {
  scale?: Float64Array;
  /** Stop when an accepted step changes f by less than relTol·(|f| + relTol). */
  relTol?: number;
  maxIterations?: number;
  /** Step of the differences, in scaled units. */
  step?: number;
  /** Forward differences (n evaluations a gradient) instead of central ones (2n); coarser, for searches. */
  forward?: boolean;
  /**
   * Exact partial derivatives: `at(par, g)` writes ∂f/∂par[i] for i ≥ `from` into g (in the units of par, at
   * the point whose value the search just took) and returns false where it cannot, so that differences are
   * used instead. Differences still give the components before `from`. Counted as one evaluation.
   */
  partial?: { from: number; at: (par: Float64Array, g: Float64Array) => boolean };
}

export interface BfgsResult {
  par: Float64Array;
  value: number;
  iterations: number;
  evaluations: number;
  converged: boolean;
}

export function bfgs(fn: (par: Float64Array) => number, start: Float64Array, options: BfgsOptions = {}): BfgsResult {
  const n = start.length;
  const scale = options.scale ?? new Float64Array(n).fill(1);
  const relTol = options.relTol ?? 1e-10;
  const maxit = options.maxIterations ?? 100;
  const step = options.step ?? (options.forward ? 1e-6 : 1e-4);
  let evaluations = 0;
  const full = new Float64Array(n);
  const f = (u: Float64Array): number => {
    for (let i = 0; i < n; i++) full[i] = u[i] * scale[i];
    evaluations++;
    const v = fn(full);
    return Number.isFinite(v) ? v : Number.MAX_VALUE;
  };
  const forward = options.forward ?? false;
  let fAt = Number.NaN;
  const w = new Float64Array(n);
  const partial = options.partial;
  const exact = new Float64Array(n);
  const grad = (u: Float64Array, g: Float64Array) => {
    w.set(u);
    let upto = n;
    if (partial && partial.from < n) {
      for (let i = 0; i < n; i++) full[i] = u[i] * scale[i];
      evaluations++;
      if (partial.at(full, exact)) {
        upto = partial.from;
        for (let i = upto; i < n; i++) g[i] = exact[i] * scale[i];
      }
    }
    if (forward) {
      for (let i = 0; i < upto; i++) {
        w[i] = u[i] + step;
        g[i] = (f(w) - fAt) / step;
        w[i] = u[i];
      }
      return;
    }
    for (let i = 0; i < upto; i++) {
      w[i] = u[i] + step;
      const up = f(w);
      w[i] = u[i] - step;
      const down = f(w);
      w[i] = u[i];
      g[i] = (up - down) / (2 * step);
    }
  };
  const b = new Float64Array(n);
  for (let i = 0; i < n; i++) b[i] = start[i] / scale[i];
  if (n === 0)
    return { par: new Float64Array(0), value: fn(new Float64Array(0)), iterations: 0, evaluations: 1, converged: true };
  let fmin = f(b);
  if (fmin === Number.MAX_VALUE)
    return { par: Float64Array.from(start), value: Number.NaN, iterations: 0, evaluations, converged: false };
  const g = new Float64Array(n);
  fAt = fmin;
  grad(b, g);
  const B = new Float64Array(n * n);
  const X = new Float64Array(n);
  const c = new Float64Array(n);
  const t = new Float64Array(n);
  let iter = 1;
  let gradcount = 1;
  let ilast = gradcount;
  let count = 0;
  const reltest = 10;
  const acctol = 1e-4;
  do {
    if (ilast === gradcount) {
      B.fill(0);
      for (let i = 0; i < n; i++) B[i * n + i] = 1;
    }
    X.set(b);
    c.set(g);
    let gradproj = 0;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < n; j++) s -= B[i * n + j] * g[j];
      t[i] = s;
      gradproj += s * g[i];
    }
    if (gradproj < 0) {
      let steplength = 1;
      let accpoint = false;
      let fv = fmin;
      do {
        count = 0;
        for (let i = 0; i < n; i++) {
          b[i] = X[i] + steplength * t[i];
          if (reltest + X[i] === reltest + b[i]) count++;
        }
        if (count < n) {
          fv = f(b);
          accpoint = fv <= fmin + gradproj * steplength * acctol;
          if (!accpoint) steplength *= 0.2;
        }
      } while (!(count === n || accpoint));
      const enough = Math.abs(fv - fmin) > relTol * (Math.abs(fmin) + relTol);
      if (!enough) {
        count = n;
        if (fv < fmin) fmin = fv;
        else b.set(X);
      }
      if (count < n) {
        fmin = fv;
        fAt = fv;
        grad(b, g);
        gradcount++;
        iter++;
        let D1 = 0;
        for (let i = 0; i < n; i++) {
          t[i] *= steplength;
          c[i] = g[i] - c[i];
          D1 += t[i] * c[i];
        }
        if (D1 > 0) {
          let D2 = 0;
          for (let i = 0; i < n; i++) {
            let s = 0;
            for (let j = 0; j < n; j++) s += B[i * n + j] * c[j];
            X[i] = s;
            D2 += s * c[i];
          }
          D2 = 1 + D2 / D1;
          for (let i = 0; i < n; i++)
            for (let j = 0; j < n; j++) B[i * n + j] += (D2 * t[i] * t[j] - X[i] * t[j] - t[i] * X[j]) / D1;
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
  const par = new Float64Array(n);
  for (let i = 0; i < n; i++) par[i] = b[i] * scale[i];
  return { par, value: fmin, iterations: iter, evaluations, converged: iter < maxit };
}
