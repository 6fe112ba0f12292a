/**
 * The built-in templates precompiled at build time (dist/render/templates.precompiled.cjs, written by
 * scripts/precompile-templates.mjs) render the very same page as templates compiled at run time, and an edited
 * built-in file is compiled afresh rather than served stale. Runs against dist/ (the build), where the file
 * lives; the reference is handlebars' own run-time compiler with the same options.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import Handlebars from 'handlebars';
import { beforeAll, describe, expect, it } from 'vitest';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const dist = join(root, 'dist/render');
const PRECOMPILED = join(dist, 'templates.precompiled.cjs');

type Mod = Record<string, (...args: never[]) => unknown>;
let html: Mod;
let templates: Mod;
let precompiled: Mod;
let view: Mod;
let brief: unknown;

beforeAll(async () => {
  html = await import(join(dist, 'html.js'));
  templates = await import(join(dist, 'templates.js'));
  precompiled = await import(join(dist, 'precompiled.js'));
  view = await import(join(root, 'dist/document/view.js'));
  const { loadJob } = await import(join(root, 'dist/job/load.js'));
  const { buildBriefs } = await import(join(root, 'dist/brief/build.js'));
  const [unit] = await buildBriefs(loadJob(join(root, 'examples/water-deliveries/job.yaml')), {
    toolVersion: 'test',
    charts: true,
    epoch: 1767225600,
  });
  brief = unit.brief;
}, 120_000);

describe('precompiled built-in templates', () => {
  it('exist after the build, one per built-in template, each for the text on disk', () => {
    expect(existsSync(PRECOMPILED)).toBe(true);
    const set = (templates.loadTemplates as (d: null) => { main: Src; partials: Map<string, Src> })(null);
    const sources = [set.main, ...set.partials.values()];
    for (const src of sources) expect(precompiled.precompiledFor(src as never), src.name).toBeDefined();
  });

  it('render the same page as compiling the same files at run time', () => {
    const set = (templates.loadTemplates as (d: null) => TemplateSet)(null);
    const fast = (html.compileBrief as (s: TemplateSet) => (v: unknown) => string)(set);
    // The same files marked as overrides: nothing precompiled may be used for them.
    const asOverride = (s: Src): Src => ({ ...s, override: true });
    const slow = (html.compileBrief as (s: TemplateSet) => (v: unknown) => string)({
      main: asOverride(set.main),
      css: set.css,
      partials: new Map([...set.partials].map(([k, v]) => [k, asOverride(v)])),
    });
    const model = view.briefView(brief as never);
    expect(fast(model)).toBe(slow(model));
  });

  it('are not used for a built-in file whose text has changed since the build', () => {
    const set = (templates.loadTemplates as (d: null) => TemplateSet)(null);
    const edited = { ...set.main, text: `${set.main.text}<!-- edited -->` };
    expect(precompiled.precompiledFor(edited as never)).toBeUndefined();
    const page = (html.compileBrief as (s: TemplateSet) => (v: unknown) => string)({ ...set, main: edited })(
      view.briefView(brief as never),
    );
    expect(page).toContain('<!-- edited -->');
  });

  it('let a run skip checking the built-in stylesheet only while its text is the one the build checked', () => {
    const set = (templates.loadTemplates as (d: null) => TemplateSet)(null);
    expect(precompiled.cssCheckedAtBuild(set.css as never)).toBe(true);
    expect(precompiled.cssCheckedAtBuild({ ...set.css, override: true } as never)).toBe(false);
    const fetching = { ...set.css, text: `${set.css.text}\nbody { background: url(https://example.org/x.png); }` };
    expect(precompiled.cssCheckedAtBuild(fetching as never)).toBe(false);
    // …and so the edited stylesheet is checked, and refused.
    expect(() =>
      (templates.checkTemplates as (s: TemplateSet, h: string[]) => void)({ ...set, css: fetching }, []),
    ).toThrow(/url/);
    // The stylesheet's entry is not a template's.
    expect(precompiled.precompiledFor({ ...set.css, name: precompiled.CSS_KEY } as never)).toBeUndefined();
  });

  it('were made with the handlebars version the renderer runs', () => {
    const text = readFileSync(PRECOMPILED, 'utf8');
    expect(text).toContain(
      `"compiler":[${(Handlebars as unknown as { COMPILER_REVISION: number }).COMPILER_REVISION},`,
    );
  });
});

interface Src {
  name: string;
  file: string;
  text: string;
  override: boolean;
}
interface TemplateSet {
  main: Src;
  css: Src;
  partials: Map<string, Src>;
}
