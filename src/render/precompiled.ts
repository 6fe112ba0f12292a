/**
 * The built-in templates compiled at build time: `npm run build` runs scripts/precompile-templates.mjs, which
 * checks the built-in set as html.ts would and writes dist/render/templates.precompiled.cjs (handlebars'
 * precompiled specs, keyed by template name). A spec is used only for a template that is not an override and
 * whose text has the SHA-256 the spec was made from, so an edited template file is compiled afresh; when the
 * file is missing (running from src/ under vitest, say) everything is compiled at run time as before.
 */
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import type { TemplateSource } from './template-source.js';

export interface PrecompiledTemplate {
  sha256: string;
  /** Names of the inline partials ({{#*inline "name"}}) the template defines. */
  inline: string[];
  spec: TemplateSpecification;
}

export const PRECOMPILED_FILE = fileURLToPath(new URL('./templates.precompiled.cjs', import.meta.url));

let table: Record<string, PrecompiledTemplate> | null | undefined;

function load(): Record<string, PrecompiledTemplate> | null {
  if (table === undefined) {
    table = existsSync(PRECOMPILED_FILE)
      ? (createRequire(import.meta.url)(PRECOMPILED_FILE) as Record<string, PrecompiledTemplate>)
      : null;
  }
  return table;
}

export function textHash(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}

/** The precompiled form of a built-in template, or undefined when it must be compiled now. */
export function precompiledFor(src: TemplateSource): PrecompiledTemplate | undefined {
  if (src.override) return undefined;
  const entry = load()?.[src.name];
  // The stylesheet's entry (CSS_KEY) has a null spec: never a template's.
  return entry !== undefined && entry.spec !== null && entry.sha256 === textHash(src.text) ? entry : undefined;
}

/** Key of the built-in stylesheet's entry (no spec; its SHA-256 when the build checked it). */
export const CSS_KEY = '#brief.css';

/** Whether this is the built-in stylesheet, unchanged since the build checked it (templates.ts checkCss). */
export function cssCheckedAtBuild(src: TemplateSource): boolean {
  if (src.override) return false;
  const entry = load()?.[CSS_KEY];
  return entry !== undefined && entry.sha256 === textHash(src.text);
}
