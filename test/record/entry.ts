/** A publication entry for the record's tests, with any field replaced. */
import type { NewEntry } from '../../src/record/types.js';

export function entry(over: Partial<NewEntry> = {}): NewEntry {
  return {
    kind: 'publication',
    brief: 'Water',
    group: '',
    series: 'north',
    period: '2026-08-01',
    reason: '',
    toolVersion: '0.1.0',
    run: 'r1',
    shard: '',
    jobSha256: 'j1',
    dataSha256: 'd1',
    message: '',
    recipient: '',
    status: '',
    body: JSON.stringify({ trendYoYPercent: 0.4 }),
    ...over,
  };
}
