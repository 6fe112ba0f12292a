#!/usr/bin/env node
// Rewrites README's job file reference (between the reference markers) from schema/job.schema.json.
// Run after changing the schema: npm run build && node scripts/readme-reference.mjs
import { readFileSync, writeFileSync } from 'node:fs';
import { schemaKeyReference } from '../dist/job/schema.js';

const START = '<!-- job-reference:start (generated from schema/job.schema.json by scripts/readme-reference.mjs) -->';
const END = '<!-- job-reference:end -->';
const file = new URL('../README.md', import.meta.url);
const text = readFileSync(file, 'utf8');
const a = text.indexOf(START);
const b = text.indexOf(END);
if (a < 0 || b < a) throw new Error('README.md has no job reference markers');
writeFileSync(file, `${text.slice(0, a + START.length)}\n\n${schemaKeyReference().trim()}\n\n${text.slice(b)}`);
