// Preloaded with --require by imports.test.ts: on exit, appends every CommonJS module the process loaded
// (require.cache, which createRequire shares) to $IMPORT_LOG, beside the ES module URLs the resolve hook
// of test/cli/files/record-imports.mjs writes there.
const { appendFileSync } = require('node:fs');

process.on('exit', () => {
  const files = Object.keys(require.cache);
  if (files.length > 0) appendFileSync(process.env.IMPORT_LOG, `${files.join('\n')}\n`);
});
