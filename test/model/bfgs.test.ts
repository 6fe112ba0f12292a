/**
 * The BFGS kernel (src/model/kernel/bfgs.as.ts) against the JavaScript loop it was written from
 * (vmminScript), bit for bit: the same searches run here through the kernel and in a child process with
 * TRENDBRIEF_MODEL_KERNEL=0, and every parameter, value and count must agree. The searches cover central,
 * forward and exact gradients, a start where the objective is not finite nearby, and the iteration limit.
 * The minimiser itself is held to R's optim(method = "BFGS") through the ARIMA fits of
 * arima-reference.test.ts, which now run through the kernel.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bfgs, bfgsKernel } from '../../src/model/bfgs.js';
import { ROOT } from '../cli/run.js';

// The searches, as source text so that the child runs exactly the same ones.
const SEARCHES = `[
  // Rosenbrock's valley from (−1.2, 1), central differences (R's optim example).
  () => bfgs(([x, y]) => 100 * (y - x * x) ** 2 + (1 - x) ** 2, Float64Array.of(-1.2, 1)),
  // The same with forward differences and a looser tolerance, as the model search asks.
  () => bfgs(([x, y]) => 100 * (y - x * x) ** 2 + (1 - x) ** 2, Float64Array.of(-1.2, 1), { forward: true, relTol: 1e-8 }),
  // Exact partial derivatives for all but the first parameter, on scaled parameters.
  () => bfgs(
    (p) => (p[0] - 3) ** 2 + Math.cosh(p[1] - 1) + (p[2] + 2) ** 4 + p[0] * p[1] / 10,
    Float64Array.of(0, 0, 0),
    {
      scale: Float64Array.of(1, 2, 0.5),
      partial: {
        from: 1,
        at: (p, g) => {
          g[1] = Math.sinh(p[1] - 1) + p[0] / 10;
          g[2] = 4 * (p[2] + 2) ** 3;
          return true;
        },
      },
    },
  ),
  // Not finite beyond a wall (log of a negative number): the line search backs off from it.
  () => bfgs(([x, y]) => (x - 4) ** 2 + (y - 1) ** 2 - Math.log(5 - x), Float64Array.of(0, 0)),
  // Stopped by the iteration limit.
  () => bfgs(([x, y]) => 100 * (y - x * x) ** 2 + (1 - x) ** 2, Float64Array.of(-1.2, 1), { maxIterations: 5 }),
  // Twelve parameters: a quadratic with a dense Hessian and a quartic term.
  () => bfgs(
    (p) => {
      let s = 0;
      for (let i = 0; i < p.length; i++) {
        s += (i + 1) * (p[i] - i / 3) ** 2 + 0.01 * p[i] ** 4;
        if (i > 0) s += 0.5 * p[i] * p[i - 1];
      }
      return s;
    },
    new Float64Array(12).fill(1),
  ),
]`;

const hex = (v: number) => Buffer.from(Float64Array.of(v).buffer).toString('hex');
type Outcome = { par: string[]; value: string; iterations: number; evaluations: number; converged: boolean };
const outcome = (r: ReturnType<typeof bfgs>): Outcome => ({
  par: Array.from(r.par, hex),
  value: hex(r.value),
  iterations: r.iterations,
  evaluations: r.evaluations,
  converged: r.converged,
});

describe('the BFGS kernel', () => {
  it('gives the JavaScript loop’s parameters, values and counts, bit for bit', () => {
    expect(bfgsKernel(), 'the kernel is built by npm run build').not.toBeNull();
    const searches = new Function('bfgs', `return ${SEARCHES};`)(bfgs) as (() => ReturnType<typeof bfgs>)[];
    const here = searches.map((s) => outcome(s()));
    const dir = mkdtempSync(join(tmpdir(), 'tb-bfgs-'));
    writeFileSync(
      join(dir, 'script.mjs'),
      `import { bfgs, bfgsKernel } from ${JSON.stringify(join(ROOT, 'dist/model/bfgs.js'))};
const hex = (v) => Buffer.from(Float64Array.of(v).buffer).toString('hex');
const out = ${SEARCHES}.map((s) => s()).map((r) => ({ par: Array.from(r.par, hex), value: hex(r.value), iterations: r.iterations, evaluations: r.evaluations, converged: r.converged }));
console.log(JSON.stringify({ kernel: bfgsKernel() !== null, out }));
`,
    );
    const child = spawnSync(process.execPath, [join(dir, 'script.mjs')], {
      encoding: 'utf8',
      env: { ...process.env, TRENDBRIEF_MODEL_KERNEL: '0' },
    });
    expect(child.status, child.stderr).toBe(0);
    const there = JSON.parse(child.stdout) as { kernel: boolean; out: Outcome[] };
    expect(there.kernel).toBe(false);
    expect(here).toEqual(there.out);
    // The searches do what they are for: Rosenbrock's minimum at (1, 1), the limit stops the fifth.
    expect(Number(searches[0]().par[0])).toBeCloseTo(1, 3);
    expect(here[4].converged).toBe(false);
  });

  it('runs a search nested in another’s objective in JavaScript, to the same result', () => {
    const inner = () => bfgs(([x, y]) => (x - 2) ** 2 + 3 * (y + 1) ** 2 + x * y, Float64Array.of(0, 0));
    const top = outcome(inner());
    let nested: Outcome | null = null;
    bfgs(([z]) => {
      nested ??= outcome(inner());
      return (z - 1) ** 2;
    }, Float64Array.of(0));
    expect(nested).toEqual(top);
  });
});
