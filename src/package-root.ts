/**
 * The package's own folder (package.json, fonts/, templates/, schema/), found upwards from this module: it
 * sits one level down in src/ (vitest) and dist/ (tsc), two in dist/bundle/ (scripts/bundle.mjs), so a
 * fixed relative path would be right in only some of them.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

function find(): URL {
  let dir = new URL('./', import.meta.url);
  for (let i = 0; i < 4; i++, dir = new URL('../', dir)) {
    if (existsSync(fileURLToPath(new URL('package.json', dir)))) return dir;
  }
  throw new Error(`no package.json above ${fileURLToPath(import.meta.url)}`);
}

export const PACKAGE_ROOT: URL = find();
