/**
 * What a logged run really loaded, file by file: the command line runs from the bundle (dist/bundle/,
 * scripts/bundle.mjs), where one chunk holds many source files. Each logged dist/bundle/*.js is replaced by
 * the files esbuild put into it (its metafile, dist/bundle/meta.json), as absolute paths (`/…/src/cli/main.ts`,
 * `/…/node_modules/pdfkit/js/pdfkit.node.mjs`); every other line is kept as it is.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

interface Meta {
  outputs: Record<string, { inputs: Record<string, unknown> }>;
}

export function loadedSources(lines: string[]): string[] {
  const meta = JSON.parse(readFileSync(join(ROOT, 'dist/bundle/meta.json'), 'utf8')) as Meta;
  const byOutput = new Map<string, string[]>();
  for (const [out, { inputs }] of Object.entries(meta.outputs)) {
    byOutput.set(
      join(ROOT, out),
      Object.keys(inputs).map((i) => join(ROOT, i.replace(/^[a-z]+:/, ''))),
    );
  }
  return lines.flatMap((line) => {
    const path = line.startsWith('file://') ? fileURLToPath(line) : line;
    return byOutput.get(path) ?? [line];
  });
}

/** What a command that writes no brief (decompose) must not load: the formats' libraries and stages. */
export const DRAWING_MODULES = [
  'vega',
  'pdfkit',
  'handlebars',
  'nodemailer',
  'resvg',
  'puppeteer',
  '/src/chart/',
  '/src/render/',
] as const;

/** The loaded files among `urls` that belong to any of `modules` (an empty list when none do). */
export function loadedOf(urls: readonly string[], modules: readonly string[]): string[] {
  return urls.filter((u) => modules.some((m) => u.includes(m)));
}
