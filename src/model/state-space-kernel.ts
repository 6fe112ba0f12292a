/**
 * The state-space filter's WebAssembly kernel (kernel/state-space.as.ts, compiled by `npm run build` into
 * dist/model/state-space-kernel.wasm): stateSpaceScript and innovationsScript, bit for bit, without the
 * JavaScript's warm-up — a fresh process runs the kernel compiled from its first call.
 *
 * Calls are many and short (series of 60–400 values, states of up to ~40), so one instance serves the whole
 * thread: this loader lays out the kernel's memory itself for each call (the kernel allocates nothing) and
 * grows it when a call needs more. The innovations operator keeps its gains here and puts them back into the
 * kernel's memory only when another call has used it since (the outlier search filters one column after
 * another with the same operator). That search's patterns (one per period and type of outlier) are laid out
 * and scanned in the kernel too: in JavaScript, a fresh process ran them interpreted (about 18 ms of a
 * one-series brief's 0.4 s) and they allocated some 11 MB of short-lived arrays. Without the file (a checkout
 * not yet built), or with TRENDBRIEF_MODEL_KERNEL=0 (the switch of the likelihood's kernel too), the callers
 * run the JavaScript, to the same bits.
 */
import { kernelModule } from './kernel-module.js';

interface Kernel {
  memory: WebAssembly.Memory;
  base(): number;
  filter(
    n: number,
    p: number,
    q: number,
    d: number,
    x: number,
    phi: number,
    theta: number,
    delta: number,
    P: number,
    Pnew: number,
    mm: number,
    M: number,
    a: number,
    anew: number,
    Rv: number,
    res: number,
    out: number,
  ): void;
  gains(
    n: number,
    p: number,
    q: number,
    d: number,
    phi: number,
    theta: number,
    delta: number,
    missing: number,
    P: number,
    Pnew: number,
    mm: number,
    M: number,
    Rv: number,
    gain: number,
    scale: number,
  ): void;
  apply(
    n: number,
    from: number,
    p: number,
    r: number,
    d: number,
    phi: number,
    delta: number,
    missing: number,
    gain: number,
    scale: number,
    x: number,
    out: number,
    a: number,
    anew: number,
  ): void;
  impulses(
    n: number,
    p: number,
    r: number,
    d: number,
    phi: number,
    delta: number,
    missing: number,
    gain: number,
    scale: number,
    x: number,
    out: number,
    a: number,
    anew: number,
  ): void;
  cumulate(n: number, src: number, dst: number, w: number): void;
  scan(
    n: number,
    lo: number,
    hi: number,
    pat: number,
    e: number,
    missing: number,
    taken: number,
    s: number,
    res: number,
  ): number;
}

/** The innovations operator: filters x (zero before `from`) into standardised innovations. */
export type Innovations = ((x: Float64Array, from?: number) => Float64Array) & {
  /**
   * The outlier search's patterns, laid out in the kernel (absent from the JavaScript operator); null when
   * they would take more than PATTERNS_MAX_BYTES of the kernel's memory, which never shrinks.
   */
  patterns?: (rate: number, ls: boolean, tc: boolean) => OutlierPatterns | null;
};

/**
 * The most memory the patterns take in the kernel: 48 MiB, three types of patterns for 1,448 periods (40
 * years of months, 27 of weeks, 4 of days). Longer series are searched by the JavaScript, whose arrays are
 * collected after the search, rather than leave the thread's kernel that large.
 */
export const PATTERNS_MAX_BYTES = 48 * 1024 * 1024;

/** Which pattern: 0 additive outlier, 1 level shift, 2 temporary change. */
export type PatternKind = 0 | 1 | 2;

/**
 * The outlier search's patterns for every period, in the kernel's memory: valid until the next call into
 * the kernel by anything else (detect-outliers.ts uses them within one search step, which makes none).
 */
export interface OutlierPatterns {
  /** Pattern `kind` at period T: a view into the kernel's memory (read it before any other kernel call). */
  row(kind: PatternKind, T: number): Float64Array;
  /**
   * The best period of [lo, hi] for `kind` against residuals e (σ̂ = s), neither missing nor in `taken` (1
   * marks a period taken), updating `best` ([found, T, ω̂, τ]: the largest |τ|, the first on ties); true when
   * this kind gave the best.
   */
  scan(
    kind: PatternKind,
    lo: number,
    hi: number,
    e: Float64Array,
    taken: Float64Array,
    s: number,
    best: Float64Array,
  ): boolean;
}

// The same path from src/model/, dist/model/ and dist/bundle/: all three are two folders deep.
const FILE = new URL('../../dist/model/state-space-kernel.wasm', import.meta.url);

let kernel: Kernel | null | undefined;
let heap = new Float64Array(0);
/** The operator whose gains are in the kernel's memory now. */
let resident: object | null = null;

function abort(): never {
  throw new Error('state-space kernel: aborted');
}

/** The thread's kernel instance, or null where the build has not made it or the JavaScript is asked for. */
export function stateSpaceKernel(): Kernel | null {
  if (kernel === undefined) {
    kernel = null;
    const module = process.env.TRENDBRIEF_MODEL_KERNEL === '0' ? null : kernelModule(FILE);
    if (module !== null) {
      // The kernel's one import besides abort: V8's logarithm, under the kernel file's name (an
      // AssemblyScript `declare function` without a decorator, which biome cannot parse).
      const imports = { env: { abort }, 'state-space.as': { hostLog: Math.log } };
      kernel = new WebAssembly.Instance(module, imports).exports as unknown as Kernel;
    }
  }
  return kernel;
}

/**
 * Memory (bytes) past which the thread's instance is let go after an outlier search: 16 MiB, the patterns of
 * about 830 periods (daily data of more than two years). The memory of an instance never shrinks, and a
 * batch of such briefs would otherwise hold it in every worker; the next call makes a new instance from the
 * compiled module (operators made before keep theirs until they are collected).
 */
const LARGE = 16 * 1024 * 1024;

/** Lets the instance go when its memory has grown past LARGE (after a long series' outlier patterns). */
export function releaseLargeMemory(): void {
  if (!kernel || kernel.memory.buffer.byteLength <= LARGE) return;
  kernel = undefined;
  resident = null;
  heap = new Float64Array(0);
}

/** Byte addresses of consecutive arrays of the given lengths (doubles) from the kernel's base; memory grown. */
function layout(k: Kernel, lengths: number[]): number[] {
  let at = k.base();
  const out = lengths.map((len) => {
    const p = at;
    at += 8 * len;
    return p;
  });
  const have = k.memory.buffer.byteLength;
  if (at > have) k.memory.grow(Math.ceil((at - have) / 65536));
  if (heap.buffer !== k.memory.buffer) heap = new Float64Array(k.memory.buffer);
  return out;
}

export interface KernelFilterResult {
  ssq: number;
  sumlog: number;
  count: number;
  state: Float64Array;
  covariance: Float64Array;
  residuals: Float64Array;
}

/** stateSpaceScript by the kernel, from the initial covariance P (rd × rd); null where there is none. */
export function filterByKernel(
  x: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
  delta: Float64Array,
  P: Float64Array,
): KernelFilterResult | null {
  const k = stateSpaceKernel();
  if (k === null) return null;
  resident = null;
  const n = x.length;
  const p = phi.length;
  const q = theta.length;
  const d = delta.length;
  const r = Math.max(p, q + 1);
  const rd = r + d;
  const [ax, aphi, atheta, adelta, aP, aPnew, amm, aM, aa, aanew, aRv, ares, aout] = layout(k, [
    n,
    p,
    q,
    d,
    rd * rd,
    rd * rd,
    rd * rd,
    rd,
    rd,
    rd,
    r,
    n,
    3,
  ]);
  heap.set(x, ax >> 3);
  heap.set(phi, aphi >> 3);
  heap.set(theta, atheta >> 3);
  heap.set(delta, adelta >> 3);
  heap.set(P, aP >> 3);
  k.filter(n, p, q, d, ax, aphi, atheta, adelta, aP, aPnew, amm, aM, aa, aanew, aRv, ares, aout);
  const o = aout >> 3;
  return {
    ssq: heap[o],
    sumlog: heap[o + 1],
    count: heap[o + 2],
    state: heap.slice(aa >> 3, (aa >> 3) + rd),
    covariance: heap.slice(aP >> 3, (aP >> 3) + rd * rd),
    residuals: heap.slice(ares >> 3, (ares >> 3) + n),
  };
}

/** innovationsScript by the kernel, from the initial covariance P (rd × rd); null where there is none. */
export function innovationsByKernel(
  phi: Float64Array,
  theta: Float64Array,
  delta: Float64Array,
  missing: (t: number) => boolean,
  n: number,
  P: Float64Array,
): Innovations | null {
  const k = stateSpaceKernel();
  if (k === null) return null;
  resident = null;
  const p = phi.length;
  const q = theta.length;
  const d = delta.length;
  const r = Math.max(p, q + 1);
  const rd = r + d;
  const miss = new Float64Array(n);
  for (let t = 0; t < n; t++) miss[t] = missing(t) ? 1 : 0;
  const [aphi, atheta, adelta, amiss, aP, aPnew, amm, aM, aRv, again, ascale] = layout(k, [
    p,
    q,
    d,
    n,
    rd * rd,
    rd * rd,
    rd * rd,
    rd,
    r,
    n * rd,
    n,
  ]);
  heap.set(phi, aphi >> 3);
  heap.set(theta, atheta >> 3);
  heap.set(delta, adelta >> 3);
  heap.set(miss, amiss >> 3);
  heap.set(P, aP >> 3);
  k.gains(n, p, q, d, aphi, atheta, adelta, amiss, aP, aPnew, amm, aM, aRv, again, ascale);
  const gain = heap.slice(again >> 3, (again >> 3) + n * rd);
  const scale = heap.slice(ascale >> 3, (ascale >> 3) + n);
  const token = {};
  let at: number[] = [];
  // The operator's arrays first (phi, delta, missing, gains, scale, x, out, a, anew), then what `more` asks
  // for: the same first addresses each time, so the operator's arrays stay where they are.
  const place = (more: number[] = []) => {
    at = layout(k, [p, d, n, n * rd, n, n, n, rd, rd, ...more]);
    if (resident !== token) {
      heap.set(phi, at[0] >> 3);
      heap.set(delta, at[1] >> 3);
      heap.set(miss, at[2] >> 3);
      heap.set(gain, at[3] >> 3);
      heap.set(scale, at[4] >> 3);
      resident = token;
    }
  };
  const op: Innovations = (x: Float64Array, from = 0) => {
    if (resident !== token) place();
    const ax = at[5] >> 3;
    for (let t = from; t < n; t++) heap[ax + t] = x[t];
    k.apply(n, from, p, r, d, at[0], at[1], at[2], at[3], at[4], at[5], at[6], at[7], at[8]);
    return heap.slice(at[6] >> 3, (at[6] >> 3) + n);
  };
  op.patterns = (rate, ls, tc) => {
    if (8 * n * n * (1 + (ls ? 1 : 0) + (tc ? 1 : 0)) > PATTERNS_MAX_BYTES) return null;
    // The additive outliers' patterns, then the level shifts' and temporary changes' (cumulated from them),
    // the residuals, the taken periods and the best candidate.
    place([n * n, ls ? n * n : 0, tc ? n * n : 0, n, n, 4]);
    const [, , amissing, , , ax, , aa, aanew, aao, als, atc, ae, ataken, abest] = at;
    k.impulses(n, p, r, d, at[0], at[1], amissing, at[3], at[4], ax, aao, aa, aanew);
    if (ls) k.cumulate(n, aao, als, 1);
    if (tc) k.cumulate(n, aao, atc, rate);
    const base = [aao, als, atc];
    return {
      row: (kind, T) => heap.subarray((base[kind] >> 3) + T * n, (base[kind] >> 3) + (T + 1) * n),
      scan: (kind, lo, hi, e, taken, s, best) => {
        heap.set(e, ae >> 3);
        heap.set(taken, ataken >> 3);
        heap.set(best.subarray(0, 4), abest >> 3);
        const better = k.scan(n, lo, hi, base[kind], ae, amissing, ataken, s, abest) !== 0;
        best.set(heap.subarray(abest >> 3, (abest >> 3) + 4));
        return better;
      },
    };
  };
  return op;
}
