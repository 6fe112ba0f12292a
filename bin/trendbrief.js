#!/usr/bin/env node
// The command line as bundled by `npm run build` (scripts/bundle.mjs): a few modules instead of some two hundred.
import { main } from '../dist/bundle/main.js';

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
