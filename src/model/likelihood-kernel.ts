/**
 * The likelihood's WebAssembly kernel (kernel/likelihood.as.ts, compiled by `npm run build` into
 * dist/model/likelihood-kernel.wasm): armaChandrasekharScript, armaLikelihoodRecordScript and the JavaScript
 * of armaLikelihoodAdjoint, start and its adjoint included, bit for bit, without the JavaScript's warm-up — a fresh process runs the
 * kernel compiled from its first call, where the JavaScript would start interpreted.
 *
 * One instance per thread, made on the first call and kept: a model search calls the likelihood thousands of
 * times on short series, so an instance per call would cost more than the steps. The kernel lays out its own
 * memory (reserve) and grows it to the longest series and largest state met; each call copies the series, φ
 * and θ in and the sums or the gradient out. The record of the last `record` stays in the kernel's memory
 * for `adjoint`; a work object remembers which record is its own (`stamp`), so a reverse pass can never read
 * another point's record. Without the file (a checkout not yet built), or with TRENDBRIEF_MODEL_KERNEL=0, the
 * JavaScript runs, to the same bits.
 */
import { kernelModule } from './kernel-module.js';

/** What the kernel exports. */
interface Kernel {
  memory: WebAssembly.Memory;
  reserve(n: number, s: number): number;
  at(k: number): number;
  record(n: number, p: number, q: number): number;
  unsettled(): number;
  adjoint(): void;
  value(n: number, p: number, q: number, residuals: number): void;
}

// The same path from src/model/, dist/model/ and dist/bundle/: all three are two folders deep.
const FILE = new URL('../../dist/model/likelihood-kernel.wasm', import.meta.url);

let kernel: Kernel | null | undefined;
let heap = new Float64Array(0);
let capN = 0;
let capS = 0;
/** Stamp of the record now in the kernel's memory (0: none). */
let current = 0;
/** Where each region starts, in doubles (kernel/likelihood.as.ts `at`). */
let off: number[] = [];

function load(): Kernel | null {
  const module = process.env.TRENDBRIEF_MODEL_KERNEL === '0' ? null : kernelModule(FILE);
  if (module === null) return null;
  return new WebAssembly.Instance(module, { 'likelihood.as': { hostLog: Math.log } }).exports as unknown as Kernel;
}

/** The kernel, or null where the build has not made it (or the JavaScript is asked for). */
export function likelihoodKernel(): Kernel | null {
  if (kernel === undefined) kernel = load();
  return kernel;
}

/** The kernel with room for n values and states of `size` elements, and its memory as doubles. */
function ready(n: number, size: number): Kernel | null {
  const k = likelihoodKernel();
  if (k === null) return null;
  if (n > capN || size > capS) {
    const n2 = Math.max(n, capN, 64);
    const s2 = Math.max(size, capS, 8);
    if (!k.reserve(n2, s2)) throw new Error('likelihood kernel: cannot grow its memory');
    capN = n2;
    capS = s2;
    off = Array.from({ length: 17 }, (_, i) => k.at(i) / 8);
    // The record of a smaller layout is gone.
    current = 0;
  }
  if (heap.buffer !== k.memory.buffer) heap = new Float64Array(k.memory.buffer);
  return k;
}

function copyIn(x: Float64Array, phi: Float64Array, theta: Float64Array, phiAt: number, thetaAt: number): void {
  heap.set(x, off[0]);
  heap.set(phi, phiAt);
  heap.set(theta, thetaAt);
}

let stamps = 0;

/**
 * The record pass by the kernel, start included: the objective (NaN where not finite) and the record's stamp,
 * or null where there is no kernel. The record stays in the kernel until the next record.
 */
export function recordByKernel(
  x: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
): { value: number; stamp: number; unsettled: number } | null {
  const k = ready(x.length, Math.max(phi.length, theta.length + 1));
  if (k === null) return null;
  copyIn(x, phi, theta, off[12], off[13]);
  const value = k.record(x.length, phi.length, theta.length);
  current = ++stamps;
  return { value, stamp: current, unsettled: k.unsettled() };
}

/** The reverse pass by the kernel for the record stamped `stamp`: ∂/∂φ, ∂/∂θ and ∂/∂x of the objective. */
export function adjointByKernel(
  stamp: number,
  gPhi: Float64Array,
  gTheta: Float64Array,
  gX: Float64Array,
  n: number,
): void {
  const k = likelihoodKernel();
  if (k === null || stamp !== current) throw new Error('likelihood kernel: the record of this point was overwritten');
  k.adjoint();
  const g = off[4];
  for (let t = 0; t < n; t++) gX[t] = heap[g + t];
  const pb = off[5];
  for (let i = 0; i < gPhi.length; i++) gPhi[i] = heap[pb + i];
  const tb = off[16];
  for (let i = 0; i < gTheta.length; i++) gTheta[i] = heap[tb + i];
}

/** The value-only pass by the kernel, start included: the sums (and residuals when asked), or null where there is no kernel. */
export function valueByKernel(
  x: Float64Array,
  phi: Float64Array,
  theta: Float64Array,
  residuals: Float64Array | null,
): { ssq: number; sumlog: number; count: number } | null {
  const n = x.length;
  const k = ready(n, Math.max(phi.length, theta.length + 1));
  if (k === null) return null;
  copyIn(x, phi, theta, off[14], off[15]);
  k.value(n, phi.length, theta.length, residuals ? 1 : 0);
  const out = off[10];
  if (residuals) {
    const at = off[9];
    for (let t = 0; t < n; t++) residuals[t] = heap[at + t];
  }
  return { ssq: heap[out], sumlog: heap[out + 1], count: n };
}
