#!/usr/bin/env node
/**
 * Writes dist/bundle/: the command line as a few ES modules instead of some two hundred, so a start compiles
 * fewer files (`npm run build` runs this after tsc; bin/trendbrief.js imports dist/bundle/main.js). esbuild
 * bundles from src/ with one entry point per thread the command line starts — main.js (the command line),
 * worker.js (a batch's worker, cli/worker.ts), series-worker.js (brief/series-worker.ts), source-worker.js
 * (data/source-worker.ts) and pdf-worker.js (render/pdf/pdf-worker.ts) — and splits what they share, and every `import()` the commands make lazily, into
 * chunks, so a command still loads only what it needs. Files the code finds beside itself (`./worker.js`,
 * `./templates.precompiled.cjs`, `../../templates/` and the like) are where it looks: the entry points keep
 * those names, the precompiled templates are copied in, and dist/bundle is as deep as dist/render.
 *
 * Plain-JavaScript packages are bundled too (see EXTERNAL for those that are not). Of these, fontkit decodes
 * brotli's dictionary and unicode-properties' tables as it is imported, and pdfkit imports linebreak (which
 * decodes its own table) and the AES code of encrypted files; a brief needs none of these unless a text goes
 * to fontkit's shaper or pdfkit's own line breaking, or a file is encrypted. In the bundle they import small
 * stand-ins (`lazy:` modules below) that load the real package on first use. pdfkit finds its data files and
 * standard fonts through `import.meta.url`; in the bundle that is pdfkit's own file again, resolved from
 * node_modules when the bundle loads.
 *
 * dist/bundle/meta.json (esbuild's metafile) says which source files each chunk holds; the tests that check
 * what a command loads read it (test/support/loaded-sources.ts).
 */
import { copyFileSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { build } from 'esbuild';

const root = new URL('../', import.meta.url);
const out = new URL('dist/bundle/', root);
rmSync(out, { recursive: true, force: true });
mkdirSync(out, { recursive: true });

/** Packages loaded on first use: the names the stand-in exports, and how a call reaches the package. */
const LAZY = {
  'unicode-properties': {
    named: ['getCategory', 'getCombiningClass', 'getScript', 'isDigit', 'isMark'],
    cjs: 'unicode-properties',
  },
  'brotli/decompress.js': { default: 'function', cjs: 'brotli/decompress.js' },
  linebreak: { default: 'class', cjs: 'linebreak' },
  '@noble/ciphers/aes': { named: ['cbc', 'ecb'], cjs: '@noble/ciphers/aes' },
};

function standIn(name) {
  const spec = LAZY[name];
  const lines = [
    "import { createRequire } from 'node:module';",
    'let real;',
    `const load = () => (real ??= createRequire(import.meta.url)(${JSON.stringify(spec.cjs)}));`,
    'const own = (m) => (m && m.__esModule && m.default !== undefined ? m.default : m);',
  ];
  for (const n of spec.named ?? []) lines.push(`export const ${n} = (...a) => load().${n}(...a);`);
  if (spec.default === 'function') lines.push('export default (...a) => own(load())(...a);');
  // A constructor: `new Stand(...)` returns the real class's instance.
  if (spec.default === 'class') lines.push('export default function Stand(...a) { return new (own(load()))(...a); }');
  return lines.join('\n');
}

const lazyPlugin = {
  name: 'trendbrief-lazy',
  setup(b) {
    const names = Object.keys(LAZY).map((n) => n.replace(/[/.@]/g, '\\$&'));
    b.onResolve({ filter: new RegExp(`^(${names.join('|')})$`) }, (args) =>
      args.namespace === 'lazy' ? undefined : { path: args.path, namespace: 'lazy' },
    );
    b.onLoad({ filter: /.*/, namespace: 'lazy' }, (args) => ({ contents: standIn(args.path), loader: 'js' }));
    // fontkit's shapers' tables (Arabic, Indic, the universal shaper), built on first use, not at import.
    b.onLoad({ filter: /[\\/]node_modules[\\/]fontkit[\\/]dist[\\/]module\.mjs$/ }, (args) => {
      const text = readFileSync(args.path, 'utf8');
      const trie = /^const (\$\w+\$var\$trie) = new \(0, (\$\w+\$unicodetrie)\)\((.*)\);$/gm;
      let count = 0;
      const contents = text.replace(trie, (_, name, cls, arg) => {
        count++;
        return `let ${name}__made;\nconst ${name} = { get: (c) => (${name}__made ??= new (0, ${cls})(${arg})).get(c) };`;
      });
      if (count !== 3) throw new Error(`fontkit: expected its 3 shaper tables, found ${count} (fontkit changed?)`);
      return { contents, loader: 'js' };
    });
    // pdfkit's import.meta.url, pointed back at pdfkit's own file in node_modules.
    b.onLoad({ filter: /[\\/]node_modules[\\/]pdfkit[\\/]js[\\/]pdfkit\.node\.mjs$/ }, (args) => {
      const text = readFileSync(args.path, 'utf8');
      const head =
        "import { createRequire as __tbRequire } from 'node:module';\n" +
        "import { pathToFileURL as __tbFileUrl } from 'node:url';\n" +
        "const __tbPdfkitUrl = __tbFileUrl(__tbRequire(import.meta.url).resolve('pdfkit')).href;\n";
      return { contents: head + text.replaceAll('import.meta.url', '__tbPdfkitUrl'), loader: 'js' };
    });
  },
};

/**
 * Packages that stay in node_modules: native code, files of their own read at run time, worker files, or
 * loaded only by some commands through createRequire (which the bundle leaves alone). The rest (yaml,
 * handlebars, pdfkit, fontkit and what they import) is plain JavaScript and goes into the bundle.
 */
const EXTERNAL = [
  '@resvg/resvg-js',
  'ajv',
  'better-sqlite3',
  'bidi-js',
  'css-tree',
  'csv-parse',
  'exceljs',
  'htmlparser2',
  'jszip',
  'mailparser',
  'nodemailer',
  'pg',
  'piscina',
  'puppeteer-core',
  'smtp-server',
  'source-sans',
  'svg-to-pdfkit',
  'vega',
  'vega-lite',
];

const externalPlugin = {
  name: 'trendbrief-external',
  setup(b) {
    b.onResolve({ filter: /^[^./]/ }, (args) => {
      if (args.namespace === 'lazy') return undefined;
      const name = args.path.startsWith('@') ? args.path.split('/').slice(0, 2).join('/') : args.path.split('/')[0];
      return EXTERNAL.includes(name) ? { path: args.path, external: true } : undefined;
    });
  },
};

/** What both builds share: everything bundled from src/ but EXTERNAL, for Node 20, into dist/bundle/. */
const common = {
  absWorkingDir: new URL('.', root).pathname,
  bundle: true,
  platform: 'node',
  target: 'node20',
  outdir: out.pathname,
  metafile: true,
  legalComments: 'none',
  // Read only with --debug (bin/trendbrief.js), so a stack names src/ and node_modules/ files, not chunks.
  sourcemap: 'linked',
  sourcesContent: false,
  logLevel: 'warning',
  plugins: [lazyPlugin, externalPlugin],
};

const result = await build({
  ...common,
  entryPoints: {
    main: 'src/cli/main.ts',
    worker: 'src/cli/worker.ts',
    'series-worker': 'src/brief/series-worker.ts',
    'source-worker': 'src/data/source-worker.ts',
    'pdf-worker': 'src/render/pdf/pdf-worker.ts',
  },
  splitting: true,
  format: 'esm',
  chunkNames: 'chunk-[hash]',
  // CommonJS packages in the bundle (handlebars, yaml's dependencies) call require for Node's own modules.
  banner: {
    js: "import { createRequire as __tbCreateRequire } from 'node:module';\nconst require = __tbCreateRequire(import.meta.url);",
  },
});

/**
 * The same command line again as one CommonJS script, dist/bundle/main.cjs, which bin/trendbrief.js runs for
 * `render` with a V8 code cache (bin/cached-script.js; the cache is written by scripts/code-cache.mjs, next).
 * No chunks: a vm.Script is one file, and its modules still run only when first imported (esbuild's lazy
 * wrappers), so only the code cache's size grows with what a brief does not use. `import()` of a package left
 * in node_modules becomes require (a vm.Script has no loader for dynamic imports); `import.meta.url` is the
 * script's own URL, which resolves beside it as the chunks' does. Comments and blank space are dropped (less
 * to read and hash at each start), and the text must be ASCII: it is read as latin1, one byte a character.
 */
const script = await build({
  ...common,
  entryPoints: { main: 'src/cli/main.ts' },
  outExtension: { '.js': '.cjs' },
  format: 'cjs',
  supported: { 'dynamic-import': false },
  define: { 'import.meta.url': '__tbImportMetaUrl' },
  minifyWhitespace: true,
  charset: 'ascii',
  // The script is the body of a CommonJS module's function, written here rather than wrapped at each start
  // (bin/cached-script.js compiles the file as it is, with no second copy of its text).
  banner: {
    js: "(function (exports, require, module, __filename, __dirname) {\nconst __tbImportMetaUrl = require('node:url').pathToFileURL(__filename).href;",
  },
  footer: { js: '})' },
});
const text = readFileSync(new URL('main.cjs', out), 'latin1');
const wide = text.search(/[^\x00-\x7f]/);
if (wide >= 0) {
  throw new Error(
    `dist/bundle/main.cjs: a character outside ASCII at offset ${wide} (${JSON.stringify(text.slice(wide - 40, wide + 10))}): write it as a \\u escape in the source`,
  );
}
copyFileSync(new URL('dist/render/templates.precompiled.cjs', root), new URL('templates.precompiled.cjs', out));
const outputs = { ...result.metafile.outputs, ...script.metafile.outputs };
writeFileSync(new URL('meta.json', out), JSON.stringify({ inputs: result.metafile.inputs, outputs }));
