#!/usr/bin/env node
// The command line as bundled by `npm run build` (scripts/bundle.mjs): a few modules instead of some two
// hundred. With --debug, stacks are mapped back to the source files (the bundle's source maps).
if (process.argv.includes('--debug')) process.setSourceMapsEnabled(true);
const { main } = await import('../dist/bundle/main.js');

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
