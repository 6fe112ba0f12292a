/**
 * The three example jobs built in-process (no charts, a fixed epoch), once per test file.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { type BriefUnit, buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import type { Brief } from '../../src/vocabulary/brief.js';

export const EXAMPLES_DIR = join(import.meta.dirname, '..', '..', 'examples');

export const EXAMPLE_NAMES = readdirSync(EXAMPLES_DIR, { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name)
  .sort();

let cached: Promise<Map<string, BriefUnit[]>> | null = null;

export function exampleUnits(): Promise<Map<string, BriefUnit[]>> {
  cached ??= (async () => {
    const out = new Map<string, BriefUnit[]>();
    for (const name of EXAMPLE_NAMES) {
      const job = loadJob(join(EXAMPLES_DIR, name, 'job.yaml'));
      out.set(name, await buildBriefs(job, { toolVersion: 'test', charts: false, epoch: 0 }));
    }
    return out;
  })();
  return cached;
}

/** Every brief of every example, with the example's name. */
export async function exampleBriefs(): Promise<{ example: string; brief: Brief }[]> {
  const out: { example: string; brief: Brief }[] = [];
  for (const [example, units] of await exampleUnits()) {
    for (const u of units) {
      if (u.error) throw u.error;
      if (u.brief) out.push({ example, brief: u.brief });
    }
  }
  return out;
}
