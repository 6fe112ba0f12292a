/**
 * Minimises a smooth function by the BFGS variable-metric method with a backtracking line search, the
 * gradient by central differences (or forward ones, or exact partial derivatives where the caller has them). Source: Nash, Compact Numerical Methods for Computers, 2nd ed. (1990),
 * Algorithm 21 (the variable-metric minimiser R's optim uses for method "BFGS", vmmin); Fletcher (1970),
 * Computer Journal 13(3), 317–322 for the update. Parameters are searched in units of `scale`.
 *
 * The iterations run in a WebAssembly kernel (kernel/bfgs.as.ts, built into dist/model/bfgs-kernel.wasm),
 * which calls back here for the objective and its gradient; vmminScript below is its reference, bit for
 * bit, and runs where the kernel is not built, with TRENDBRIEF_MODEL_KERNEL=0, or for a search nested in
 * another's objective. In JavaScript, a fresh process ran the loop interpreted for the first tens of fits,
 * and its optimised code was thrown away whenever a fit brought a new objective.
 *
 *   bfgs(([x, y]) => (x − 1)² + 10(y + 2)², [0, 0]) → par ≈ [1, −2]
 */
import { kernelModule } from './kernel-module.js';

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
  const k = depth === 0 ? bfgsKernel() : null;
  let iter: number;
  if (k !== null && n <= KERNEL_MAX_PARAMETERS) {
    // The loop in the kernel, with b and g in its memory; the objective and gradient answer from here.
    const { b: kb, g: kg, at } = placeOn(k, n);
    kb.set(b);
    kg.set(g);
    depth++;
    search = {
      value: () => f(kb),
      gradient: (fv) => {
        fAt = fv;
        grad(kb, kg);
      },
    };
    try {
      fmin = k.minimise(n, fmin, maxit, relTol, at[0], at[1], at[2], at[3], at[4], at[5]);
    } finally {
      depth--;
      search = null;
    }
    b.set(kb);
    iter = k.iterationsDone();
  } else {
    const out = vmminScript(n, fmin, maxit, relTol, b, g, f, (fv) => {
      fAt = fv;
      grad(b, g);
    });
    fmin = out.fmin;
    iter = out.iter;
  }
  const par = new Float64Array(n);
  for (let i = 0; i < n; i++) par[i] = b[i] * scale[i];
  return { par, value: fmin, iterations: iter, evaluations, converged: iter < maxit };
}

/**
 * vmmin's iterations from b (value fmin, gradient g), leaving the minimum in b: the kernel's reference
 * (kernel/bfgs.as.ts), step for step, and the loop where there is no kernel or the search is nested in another.
 */
function vmminScript(
  n: number,
  start: number,
  maxit: number,
  relTol: number,
  b: Float64Array,
  g: Float64Array,
  f: (u: Float64Array) => number,
  gradient: (fAt: number) => void,
): { fmin: number; iter: number } {
  let fmin = start;
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
        gradient(fv);
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
  return { fmin, iter };
}

/** What the kernel exports. */
interface Kernel {
  memory: WebAssembly.Memory;
  base(): number;
  iterationsDone(): number;
  minimise(
    n: number,
    fmin: number,
    maxit: number,
    relTol: number,
    b: number,
    g: number,
    B: number,
    X: number,
    c: number,
    t: number,
  ): number;
}

/** Searches with more parameters run in JavaScript: their n × n matrix would stay in the kernel's memory. */
const KERNEL_MAX_PARAMETERS = 256;

// The same path from src/model/, dist/model/ and dist/bundle/: all three are two folders deep.
const FILE = new URL('../../dist/model/bfgs-kernel.wasm', import.meta.url);

let kernel: Kernel | null | undefined;
/** The search whose objective and gradient the kernel's imports call now (one at a time per thread). */
let search: { value: () => number; gradient: (fAt: number) => void } | null = null;
/** Searches running in this thread: one nested in another's objective runs in JavaScript. */
let depth = 0;

function abort(): never {
  throw new Error('BFGS kernel: aborted');
}

/** The thread's kernel, or null where the build has not made it or TRENDBRIEF_MODEL_KERNEL=0 asks for the JavaScript. */
export function bfgsKernel(): Kernel | null {
  if (kernel === undefined) {
    kernel = null;
    const module = process.env.TRENDBRIEF_MODEL_KERNEL === '0' ? null : kernelModule(FILE);
    if (module !== null) {
      const imports = {
        env: { abort },
        'bfgs.as': {
          value: () => (search as NonNullable<typeof search>).value(),
          gradient: (fAt: number) => (search as NonNullable<typeof search>).gradient(fAt),
        },
      };
      kernel = new WebAssembly.Instance(module, imports).exports as unknown as Kernel;
    }
  }
  return kernel;
}

/** Views of b and g in the kernel's memory, and the byte addresses of b, g, B, X, c and t; memory grown. */
function placeOn(k: Kernel, n: number): { b: Float64Array; g: Float64Array; at: number[] } {
  const lengths = [n, n, n * n, n, n, n];
  let next = k.base();
  const at = lengths.map((len) => {
    const p = next;
    next += 8 * len;
    return p;
  });
  const have = k.memory.buffer.byteLength;
  if (next > have) k.memory.grow(Math.ceil((next - have) / 65536));
  return {
    b: new Float64Array(k.memory.buffer, at[0], n),
    g: new Float64Array(k.memory.buffer, at[1], n),
    at,
  };
}
