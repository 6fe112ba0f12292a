#!/usr/bin/env node
/**
 * Compiles STL's WebAssembly kernel (src/decompose/kernel/stl.as.ts, AssemblyScript) into
 * dist/decompose/stl-kernel.wasm, where src/decompose/stl-kernel.ts looks for it from src/, dist/ and
 * dist/bundle/ alike. Part of `npm run build`; the compiler is the assemblyscript package (a dev
 * dependency, plain JavaScript and WebAssembly: nothing is downloaded).
 *
 * --uncheckedBehavior always: no bounds checks on typed-array indices (the kernel's indices are those of
 * the JavaScript it copies, and the tests compare the two bit for bit); the stub runtime never frees, so
 * each fit gets an instance of its own whose memory goes when the fit is done.
 */
import { mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const asc = await import('assemblyscript/asc').then(
  (m) => m.default,
  () => {
    process.stderr.write('stl-kernel: the assemblyscript package is missing: run npm ci (package-lock.json lists it)\n');
    process.exit(1);
  },
);

const root = new URL('../', import.meta.url);
mkdirSync(new URL('dist/decompose/', root), { recursive: true });
const { error, stderr } = await asc.main(
  [
    'src/decompose/kernel/stl.as.ts',
    '--outFile',
    'dist/decompose/stl-kernel.wasm',
    '-O3',
    '--noAssert',
    '--runtime',
    'stub',
    '--uncheckedBehavior',
    'always',
    '--baseDir',
    fileURLToPath(root),
  ],
  { stdout: process.stdout, stderr: process.stderr },
);
if (error) {
  process.stderr.write(`stl-kernel: ${error.message}\n${stderr?.toString() ?? ''}`);
  process.exit(1);
}
