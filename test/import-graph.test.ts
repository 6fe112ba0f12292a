/**
 * The shape of src/: every import (static, dynamic, type-only, re-export) read with the TypeScript
 * compiler's own pre-processor, then two rules checked on the graph of files:
 *   1. no cycle, type-only imports included (Tarjan's strongly connected components);
 *   2. every arrow points down the pipeline: a stage imports only earlier stages, the shared vocabulary
 *      and the libraries; the vocabulary imports nothing but itself; a library imports no stage.
 * An arrow that breaks rule 2 on purpose is in ALLOWED below with its reason; nothing else is.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const SRC = resolve(import.meta.dirname, '../src');

/** The stages in the order a job passes through them; a stage may import those before it. */
const STAGES = [
  'job',
  'data',
  'adjust',
  'decompose',
  'diagnose',
  'analyse',
  'narrate',
  'chart',
  'brief',
  'document',
  'render',
  'record',
  'cli',
  'index.ts',
];
/** Beside the stages: imported by any of them, importing no stage. */
const LIBRARIES = [
  'vocabulary',
  'model',
  'calendar',
  'errors.ts',
  'read-file.ts',
  'suggest.ts',
  'utf8.ts',
  'package-root.ts',
  'thread-entry.ts',
];
/** The claim checker reads only the Brief (the vocabulary) and the libraries, never the narrator. */
const READERS = ['verify'];

/**
 * Arrows against the rules, each with why. `from -> to` are file paths under src/.
 */
const ALLOWED: Record<string, string> = {
  // A setting is resolved once, in job/, and travels down (DEVELOPERS.md); resolving STL's windows and
  // the automatic additive/multiplicative choice needs those methods' own published rules, which are pure
  // functions of numbers in the files that implement them; copying them into job/ would let the two drift.
  'job/resolve.ts -> decompose/stl.ts': 'STL settings rule (stats::stl defaults)',
  'job/resolve.ts -> decompose/mstl.ts': 'MSTL default seasonal windows (forecast::mstl)',
  'job/resolve.ts -> diagnose/model-choice.ts': 'the model is chosen once, when settings are resolved',
  // forecast::nsdiffs measures seasonal strength on an MSTL decomposition; the ARIMA library does the same
  // with our MSTL, a pure numerical function that imports no job or brief type.
  'model/seasonal-differences.ts -> decompose/mstl.ts': 'nsdiffs seasonal-strength heuristic uses MSTL',
  // Debt, not design: the job's named events and holiday file are resolved with data/'s date parser and
  // holiday-file reader; both belong in data/ (or the vocabulary) and should move there.
  'job/resolve-effects.ts -> data/dates.ts': 'event dates parsed as data dates are (to move)',
  'job/resolve-effects.ts -> data/holiday-file.ts': 'the holiday file read with the job (to move)',
};

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sourceFiles(p));
    else if (p.endsWith('.ts') && !p.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

/** file (relative to src/) → the files under src/ it imports. */
function importGraph(): Map<string, string[]> {
  const graph = new Map<string, string[]>();
  for (const file of sourceFiles(SRC)) {
    const info = ts.preProcessFile(readFileSync(file, 'utf8'), true, true);
    const targets = info.importedFiles
      .map((f) => f.fileName)
      .filter((spec) => spec.startsWith('.'))
      .map((spec) => relative(SRC, resolve(dirname(file), spec)).replace(/\.js$/, '.ts'));
    graph.set(relative(SRC, file), [...new Set(targets)]);
  }
  return graph;
}

function cycles(graph: Map<string, string[]>): string[][] {
  let next = 0;
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const found: string[][] = [];
  const visit = (v: string): void => {
    index.set(v, next);
    low.set(v, next);
    next++;
    stack.push(v);
    onStack.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!graph.has(w)) continue;
      if (!index.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v) as number, low.get(w) as number));
      } else if (onStack.has(w)) low.set(v, Math.min(low.get(v) as number, index.get(w) as number));
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop() as string;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1 || (graph.get(v) ?? []).includes(v)) found.push(component.sort());
    }
  };
  for (const v of graph.keys()) if (!index.has(v)) visit(v);
  return found;
}

function place(file: string): string {
  return file.split('/')[0];
}

/** Why `from` may not import `to`, or null when it may. */
function backwardArrow(from: string, to: string): string | null {
  const a = place(from);
  const b = place(to);
  if (a === b) return null;
  if (a === 'vocabulary') return 'the vocabulary imports nothing from the rest of src/';
  if (LIBRARIES.includes(a))
    return LIBRARIES.includes(b) && b !== 'model' && b !== 'calendar'
      ? null
      : 'a library imports no stage or other library';
  if (READERS.includes(a)) return LIBRARIES.includes(b) ? null : 'the checker reads only the Brief and the libraries';
  if (LIBRARIES.includes(b)) return null;
  if (READERS.includes(b))
    return STAGES.indexOf(a) >= STAGES.indexOf('cli') ? null : 'only the commands call the checker';
  const ia = STAGES.indexOf(a);
  const ib = STAGES.indexOf(b);
  if (ia < 0 || ib < 0) return `${ia < 0 ? a : b} is in no layer: add it to STAGES or LIBRARIES`;
  return ib > ia ? `${a}/ comes before ${b}/ in the pipeline` : null;
}

function violations(graph: Map<string, string[]>): string[] {
  const out: string[] = [];
  for (const [from, targets] of graph) {
    for (const to of targets) {
      const why = backwardArrow(from, to);
      if (why && !ALLOWED[`${from} -> ${to}`]) out.push(`${from} -> ${to}: ${why}`);
    }
  }
  return out.sort();
}

describe('the import graph of src/', () => {
  const graph = importGraph();

  it('reads imports of every kind', () => {
    // Sanity checks that the reader sees static, type-only and dynamic imports.
    expect(graph.get('vocabulary/brief.ts')).toContain('vocabulary/claims.ts'); // import type
    expect(graph.get('brief/series.ts')).toContain('chart/index.ts'); // await import(…)
    expect(graph.size).toBeGreaterThan(200);
  });

  it('has no cycle', () => {
    // Debt: narrate/effects.ts takes the Words helper type from statements.ts, which calls it (type-only,
    // erased at run time); Words should move to a file of its own.
    const known = ['narrate/effects.ts,narrate/statements.ts'];
    expect(cycles(graph).filter((c) => !known.includes(c.join(',')))).toEqual([]);
  });

  it('has no backward arrow beyond the stated exceptions', () => {
    expect(violations(graph)).toEqual([]);
  });

  it('lists no exception that no longer occurs', () => {
    const arrows = new Set([...graph].flatMap(([from, targets]) => targets.map((to) => `${from} -> ${to}`)));
    expect(Object.keys(ALLOWED).filter((a) => !arrows.has(a))).toEqual([]);
  });

  it('finds a cycle and a backward arrow when there is one', () => {
    const bad = new Map<string, string[]>([
      ['analyse/a.ts', ['brief/b.ts']],
      ['brief/b.ts', ['analyse/a.ts']],
      ['vocabulary/v.ts', ['data/d.ts']],
      ['data/d.ts', []],
    ]);
    expect(cycles(bad)).toEqual([['analyse/a.ts', 'brief/b.ts']]);
    expect(violations(bad)).toEqual([
      'analyse/a.ts -> brief/b.ts: analyse/ comes before brief/ in the pipeline',
      'vocabulary/v.ts -> data/d.ts: the vocabulary imports nothing from the rest of src/',
    ]);
  });
});
