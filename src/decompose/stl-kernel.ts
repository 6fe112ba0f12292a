/**
 * STL's WebAssembly kernel (kernel/stl.as.ts, compiled by `npm run build` into
 * dist/decompose/stl-kernel.wasm): the fit of stl.ts, bit for bit, without the JavaScript's warm-up — a
 * fresh process runs the kernel compiled from its first call, where stl.ts would start interpreted.
 *
 * The compiled module is read and compiled once per process, on the first fit, and instantiated once per
 * thread: each fit frees the last one's arrays (the kernel's `reset`), copies the values in and its four
 * components out. An instance per fit, as before, cost a tenth of a millisecond each (a new memory to map,
 * zero and collect), 30–50 ms of a 12-series brief's main thread with its firmness and sensitivity re-fits.
 * An instance whose memory has grown past BIG after a fit (a series of some 700,000 values) is let go,
 * so a long series' memory is not held for the rest of a batch. Without the file (a checkout not yet
 * built) stl.ts fits in JavaScript, to the same bits.
 */
import { kernelModule } from '../model/kernel-module.js';

/** What the kernel exports. */
interface Kernel {
  memory: WebAssembly.Memory;
  reset(): void;
  input(n: number): number;
  output(k: number): number;
  fit(
    n: number,
    np: number,
    period: number,
    periodic: number,
    ns: number,
    seasonalDegree: number,
    seasonalJump: number,
    nt: number,
    trendDegree: number,
    trendJump: number,
    nl: number,
    lowpassDegree: number,
    lowpassJump: number,
    inner: number,
    outer: number,
    trueMedian: number,
  ): void;
}

/** The settings of one fit, resolved as stl.ts resolves them. */
export interface KernelSettings {
  np: number;
  period: number;
  periodic: boolean;
  ns: number;
  seasonalDegree: number;
  seasonalJump: number;
  nt: number;
  trendDegree: number;
  trendJump: number;
  nl: number;
  lowpassDegree: number;
  lowpassJump: number;
  inner: number;
  outer: number;
  trueMedian: boolean;
}

export interface KernelFit {
  trend: Float64Array;
  seasonal: Float64Array;
  remainder: Float64Array;
  weights: Float64Array;
}

// The same path from src/decompose/, dist/decompose/ and dist/bundle/: all three are two folders deep.
const FILE = new URL('../../dist/decompose/stl-kernel.wasm', import.meta.url);

/** The compiled kernel, or null where the build has not made it. */
export function stlKernel(): WebAssembly.Module | null {
  return kernelModule(FILE);
}

/** This thread's instance, made on its first fit. */
let instance: Kernel | null = null;

/** Memory (bytes) past which the instance is let go after its fit: 64 MiB, a series of about 700,000 values. */
const BIG = 64 * 1024 * 1024;

function abort(): never {
  throw new Error('STL kernel: aborted (out of memory?)');
}

/** STL of values by the kernel; null where there is no kernel. */
export function fitByKernel(values: Float64Array, s: KernelSettings): KernelFit | null {
  const module = stlKernel();
  if (module === null) return null;
  instance ??= new WebAssembly.Instance(module, { env: { abort } }).exports as unknown as Kernel;
  const k = instance;
  k.reset();
  const n = values.length;
  const at = k.input(n);
  new Float64Array(k.memory.buffer, at, n).set(values);
  k.fit(
    n,
    s.np,
    s.period,
    s.periodic ? 1 : 0,
    s.ns,
    s.seasonalDegree,
    s.seasonalJump,
    s.nt,
    s.trendDegree,
    s.trendJump,
    s.nl,
    s.lowpassDegree,
    s.lowpassJump,
    s.inner,
    s.outer,
    s.trueMedian ? 1 : 0,
  );
  // The memory may have grown during the fit: views are taken afterwards, and copied out.
  const component = (c: number) => new Float64Array(k.memory.buffer, k.output(c), n).slice();
  const trend = component(0);
  const seasonal = component(1);
  const weights = component(2);
  const remainder = new Float64Array(n);
  for (let i = 0; i < n; i++) remainder[i] = values[i] - seasonal[i] - trend[i];
  if (k.memory.buffer.byteLength > BIG) instance = null;
  return { trend, seasonal, remainder, weights };
}
