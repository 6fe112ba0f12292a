// Loaded with --require: records into $IMPORT_LOG, as file URLs, the files the process and its threads load
// through require (CommonJS, and ES modules that Node's require loads itself), which the import hooks of
// record-imports.mjs do not see.
const { appendFileSync } = require('node:fs');
const Module = require('node:module');
const { pathToFileURL } = require('node:url');

const load = Module._load;
Module._load = function logged(request, parent, isMain, ...rest) {
  const exports = load.call(this, request, parent, isMain, ...rest);
  try {
    const file = Module._resolveFilename(request, parent, isMain);
    if (file.startsWith('/')) appendFileSync(process.env.IMPORT_LOG, `${pathToFileURL(file).href}\n`);
  } catch {
    // A request that resolves to no file (a built-in module): nothing to record.
  }
  return exports;
};
