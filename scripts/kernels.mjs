#!/usr/bin/env node
/**
 * Compiles every WebAssembly kernel, src/STAGE/kernel/NAME.as.ts (AssemblyScript), into
 * dist/STAGE/NAME-kernel.wasm, where the stage's loader (e.g. src/decompose/stl-kernel.ts) looks for it
 * from src/, dist/ and dist/bundle/ alike. Part of `npm run build`; the compiler is the assemblyscript
 * package (a dev dependency, plain JavaScript and WebAssembly: nothing is downloaded).
 *
 * --uncheckedBehavior always: no bounds checks on typed-array indices (a kernel's indices are those of
 * the JavaScript it copies, and the tests compare the two bit for bit); the stub runtime never frees, so
 * a loader gives each piece of work an instance of its own, or reuses one whose memory it manages.
 */
import { mkdirSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const asc = await import('assemblyscript/asc').then(
  (m) => m.default,
  () => {
    process.stderr.write('kernels: the assemblyscript package is missing: run npm ci (package-lock.json lists it)\n');
    process.exit(1);
  },
);

const root = new URL('../', import.meta.url);
const src = new URL('src/', root);
const kernels = readdirSync(src, { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .flatMap((d) => {
    let files = [];
    try {
      files = readdirSync(new URL(`${d.name}/kernel/`, src)).filter((f) => f.endsWith('.as.ts'));
    } catch {
      return [];
    }
    return files.map((f) => ({ stage: d.name, file: f, name: f.slice(0, -'.as.ts'.length) }));
  })
  .sort((a, b) => `${a.stage}/${a.name}`.localeCompare(`${b.stage}/${b.name}`));

for (const k of kernels) {
  mkdirSync(new URL(`dist/${k.stage}/`, root), { recursive: true });
  const { error, stderr } = await asc.main(
    [
      `src/${k.stage}/kernel/${k.file}`,
      '--outFile',
      `dist/${k.stage}/${k.name}-kernel.wasm`,
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
    process.stderr.write(`kernels: ${k.stage}/${k.file}: ${error.message}\n${stderr?.toString() ?? ''}`);
    process.exit(1);
  }
}
