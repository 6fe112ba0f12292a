/**
 * Test helper: the example briefs built once per test file, stamped with a fixed generation time (the
 * same effect as SOURCE_DATE_EPOCH) so every run compares like with like.
 */
import { buildBriefs } from '../../../src/brief/build.js';
import { loadJob } from '../../../src/job/load.js';
import type { Brief } from '../../../src/vocabulary/brief.js';

/** 2023-11-14T22:13:20Z. */
export const EPOCH = 1_700_000_000;

const cache = new Map<string, Promise<Brief[]>>();

export function exampleBriefs(name: 'water-deliveries' | 'online-orders' | 'clinic-visits'): Promise<Brief[]> {
  let briefs = cache.get(name);
  if (!briefs) {
    briefs = buildBriefs(loadJob(`examples/${name}/job.yaml`), {
      toolVersion: '0.0.0-test',
      charts: true,
      epoch: EPOCH,
    }).then((units) =>
      units.map((u) => {
        if (!u.brief) throw new Error(`example ${name} failed: ${u.error?.oneLine()}`);
        return u.brief;
      }),
    );
    cache.set(name, briefs);
  }
  return briefs;
}
