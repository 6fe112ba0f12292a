#!/usr/bin/env node
// The command line as bundled by `npm run build` (scripts/bundle.mjs), in one of two builds of the same
// sources. `render` runs dist/bundle/main.cjs, one script with the V8 code cache made at build time
// (cached-script.js): a brief runs most of the code, and the cache spares compiling it. Every other command,
// and any command with --debug, imports dist/bundle/main.js and its chunks, which load only what the command
// needs (`decompose` no chart or PDF code); with --debug, stacks are mapped back to the source files. A
// batch of briefs runs in a second process with other V8 flags (batch-process.js).
const args = process.argv.slice(2);
// The options main.ts takes before the command; one it adds later only sends `render` the other way.
const command = args.find((a) => a !== '--quiet' && a !== '-q' && a !== '--verbose' && a !== '--debug');
if (command === 'render') {
  const { isBatch, runBatchProcess } = await import('./batch-process.js');
  const code = isBatch(args) ? await runBatchProcess(args) : null;
  if (code !== null) process.exit(code);
}
let main;
if (command === 'render' && !args.includes('--debug')) {
  const { loadBundle } = await import('./cached-script.js');
  ({ main } = loadBundle().exports);
} else {
  if (args.includes('--debug')) process.setSourceMapsEnabled(true);
  ({ main } = await import('../dist/bundle/main.js'));
}

main(args).then((code) => {
  process.exitCode = code;
});
