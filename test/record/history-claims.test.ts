/**
 * The statements built from the record carry claims the verifier (src/verify/, which shares no code with
 * the narrator) finds true, and it finds each one false once a figure in it is made false. The history
 * comes from real builds of the water example: eight months published in turn, the last with one past
 * value corrected in the source, as examples/history.mjs does through the command line.
 */
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import type { LoadedData } from '../../src/data/load.js';
import { loadJob } from '../../src/job/load.js';
import { pastIssues, publicationEntries } from '../../src/record/publication.js';
import type { Entry } from '../../src/record/types.js';
import { describeFindings, verifySeries } from '../../src/verify/index.js';
import type { Brief, PastIssue, SeriesBrief } from '../../src/vocabulary/brief.js';
import { ROOT } from '../cli/run.js';

const MONTHS = ['2026-02', '2026-03', '2026-04', '2026-05', '2026-06', '2026-07', '2026-08'];

async function build(period: string, past: Map<string, PastIssue[]>, cache: Map<string, LoadedData>): Promise<Brief> {
  const job = loadJob(`${ROOT}examples/water-deliveries/job.yaml`);
  const [unit] = await buildBriefs(job, { period, toolVersion: '0.1.0', charts: false, cache, past });
  if (!unit.brief) throw unit.error;
  return unit.brief;
}

describe('claims of the statements from the record', async () => {
  const job = loadJob(`${ROOT}examples/water-deliveries/job.yaml`);
  const cache = new Map<string, LoadedData>();
  const entries: Entry[] = [];
  for (const month of MONTHS) {
    const brief = await build(month, pastIssues(entries), cache);
    publicationEntries(job, null, brief, [], { run: month, shard: '', reason: '' }).forEach((e, k) => {
      entries.push({ ...e, seq: entries.length + k + 1, issue: 1, recordedAt: '', prevHash: '', hash: '' });
    });
  }
  // The supplier corrects July 2026 in the North zone before September's brief.
  const [data] = cache.values();
  const g = data.groups[0];
  const july = g.dates.indexOf('2026-07-01');
  const before = g.series.values[july];
  const values = Float64Array.from(g.series.values);
  values[july] = before + 500;
  const corrected = new Map([[[...cache.keys()][0], { ...data, groups: [{ ...g, series: { ...g.series, values } }] }]]);
  const september = (await build('2026-09', pastIssues(entries), corrected)).series[0];

  it('makes all three statements, and every claim is true', () => {
    const ids = september.statements.map((s) => s.id);
    expect(ids).toEqual(expect.arrayContaining(['since-last', 'source-revisions', 'firmness-published']));
    expect(describeFindings(verifySeries(september))).toBe('');
    const revised = september.statements.find((s) => s.id === 'source-revisions');
    expect(revised?.text).toMatch(
      /^Since the August 2026 brief, the source data changed for 1 earlier month: July 2026 from /,
    );
    expect(september.statements.find((s) => s.id === 'since-last')?.text).toMatch(
      /^In the August 2026 brief, the trend for August 2026 was (the same as|[\d.]+% (higher|lower) than) a year before\. With data to September 2026, it is /,
    );
  });

  /** The series with one claim of one statement changed, and the verifier's findings on it. */
  function falsified(id: string, change: (claim: Record<string, unknown>) => void): string {
    const s: SeriesBrief = structuredClone(september);
    const st = s.statements.find((x) => x.id === id);
    if (!st) throw new Error(`no ${id}`);
    change(st.claims[0] as unknown as Record<string, unknown>);
    return describeFindings(verifySeries(s));
  }

  it("catches a wrong figure for today's change at the last brief's period", () => {
    expect(falsified('since-last', (c) => (c.now = (c.now as number) + 0.3))).toMatch(
      /since-last \[since-last-brief\]: gives/,
    );
  });

  it('catches a source value that is not what the data hold today', () => {
    expect(
      falsified('source-revisions', (c) => {
        (c.named as { after: number }[])[0].after += 1;
      }),
    ).toMatch(/says 2026-07-01 is now .*, the data hold/);
  });

  it('catches a summary that does not follow from its list', () => {
    expect(falsified('firmness-published', (c) => (c.meanAbsoluteRevision = 9))).toMatch(
      /mean absolute revision 9, list gives/,
    );
  });
});
