/**
 * The Hessian of a function at a point by differences of a numerical gradient, by the rule of R's
 * optimHess (R Core Team, src/library/stats/src/optim.c, `optimhess` and `fmingr`): each gradient
 * component is a central difference of step ndeps·parscaleᵢ; the Hessian's row i is the central
 * difference of that gradient over a step of ndeps in parameter i, and the matrix is made symmetric by
 * averaging it with its transpose. stats::arima's standard errors are this Hessian's inverse (times the
 * Jacobian of its parameter transform), so following the same rule, rather than a finer one, is what makes
 * our standard errors agree with R's to 1e-4 and not merely to 1e-3: at a step of 1e-3 the truncation
 * error of the differences is itself of that order for some models.
 *
 *   optimHessian(([x, y]) => x² + 3xy, [1, 1]) → [[2, 3], [3, 0]]
 */
export function optimHessian(
  f: (par: Float64Array) => number,
  at: Float64Array,
  parscale: Float64Array = new Float64Array(at.length).fill(1),
  ndeps = 1e-3,
): Float64Array {
  const k = at.length;
  const x = Float64Array.from(at);
  const grad = (g: Float64Array) => {
    for (let j = 0; j < k; j++) {
      const h = ndeps * parscale[j];
      const keep = x[j];
      x[j] = keep + h;
      const up = f(x);
      x[j] = keep - h;
      const down = f(x);
      x[j] = keep;
      g[j] = (up - down) / (2 * h);
    }
  };
  const g1 = new Float64Array(k);
  const g2 = new Float64Array(k);
  const H = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    const keep = x[i];
    x[i] = keep + ndeps;
    grad(g1);
    x[i] = keep - ndeps;
    grad(g2);
    x[i] = keep;
    for (let j = 0; j < k; j++) H[i * k + j] = (g1[j] - g2[j]) / (2 * ndeps);
  }
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < i; j++) {
      const v = 0.5 * (H[i * k + j] + H[j * k + i]);
      H[i * k + j] = v;
      H[j * k + i] = v;
    }
  }
  return H;
}
