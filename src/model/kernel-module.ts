/**
 * A WebAssembly kernel's compiled module (scripts/kernels.mjs builds each src/STAGE/kernel/NAME.as.ts into
 * dist/STAGE/NAME-kernel.wasm), read and compiled on first use and kept for the thread, which makes its
 * instances from it; null where the build has not made the file (a checkout not yet built), and the caller
 * then runs its JavaScript.
 */
import { readFileSync } from 'node:fs';

const modules = new Map<string, WebAssembly.Module | null>();

export function kernelModule(file: URL): WebAssembly.Module | null {
  let module = modules.get(file.href);
  if (module === undefined) {
    let bytes: Uint8Array<ArrayBuffer> | null = null;
    try {
      bytes = new Uint8Array(readFileSync(file));
    } catch {
      bytes = null;
    }
    module = bytes === null ? null : new WebAssembly.Module(bytes);
    modules.set(file.href, module);
  }
  return module;
}
