/** README's promises: the job reference matches the schema, and the quick start names real files. */
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { schemaKeyReference } from '../src/job/schema.js';

const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8');

describe('README', () => {
  it('carries the job file reference generated from the schema (run scripts/readme-reference.mjs)', () => {
    const start = readme.indexOf('<!-- job-reference:start');
    const end = readme.indexOf('<!-- job-reference:end -->');
    expect(start).toBeGreaterThan(0);
    const block = readme.slice(readme.indexOf('-->', start) + 3, end).trim();
    expect(block).toBe(schemaKeyReference().trim());
  });
  it('has the two quick-start commands, each in its own code block, naming files that exist', () => {
    const blocks = [...readme.matchAll(/```sh\n([\s\S]*?)```/g)].map((m) => m[1].trim());
    expect(blocks[0]).toMatch(/^npm ci && node bin\/trendbrief\.js render examples\/[\w-]+\/job\.yaml/);
    expect(blocks[1]).toBe('npm test');
    const job = /render (\S+)/.exec(blocks[0])?.[1] ?? '';
    expect(existsSync(new URL(`../${job}`, import.meta.url))).toBe(true);
  });
});
