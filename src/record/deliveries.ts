/**
 * Email sent once: each message's fate at each recipient is a delivery entry in the record, keyed by what
 * the brief says (its name, group, the series' periods and every statement's text), so a rerun of the same
 * brief sends only to the recipients who have not got it, while a brief whose words changed (a re-issue
 * with revised figures) goes to everyone again.
 */

import { createHash } from 'node:crypto';
import { bytesOf, type OutputFile } from '../render/write.js';
import type { Brief } from '../vocabulary/brief.js';
import type { Job } from '../vocabulary/settings.js';
import type { RecordRun } from './publication.js';
import { briefName } from './publication.js';
import type { RecordStore } from './store.js';
import type { DeliveryBody, NewEntry } from './types.js';

/** The message's key: SHA-256 of what the brief says, not of the file (whose date and Message-ID change). */
export function messageKey(job: Job, group: string | null, brief: Brief): string {
  const h = createHash('sha256');
  h.update(JSON.stringify([briefName(job), group ?? '']));
  for (const s of brief.series) h.update(JSON.stringify([s.id, s.reportingDate, s.statements.map((x) => x.text)]));
  return h.digest('hex');
}

/** An address as the server sees it: the part inside <…>, lower case. */
export function mailbox(address: string): string {
  const m = /<([^<>]+)>\s*$/.exec(address);
  return (m ? m[1] : address).trim().toLowerCase();
}

/** Recipients who already got this message (by mailbox). */
export async function deliveredTo(store: RecordStore, key: string): Promise<Set<string>> {
  const entries = await store.entries({ kind: 'delivery', message: key });
  return new Set(entries.filter((e) => e.status === 'accepted').map((e) => e.recipient));
}

export interface Outcome {
  accepted: string[];
  refused: { address: string; code: number | null; reply: string }[];
}

/** One delivery entry per recipient of one sending of one message. */
export function deliveryEntries(
  job: Job,
  group: string | null,
  brief: Brief,
  key: string,
  file: Pick<OutputFile, 'path' | 'bytes'>,
  outcome: Outcome,
  run: RecordRun,
): NewEntry[] {
  const bytes = bytesOf(file);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const periods = [...new Set(brief.series.map((s) => s.reportingDate))].join(' ');
  const entry = (recipient: string, status: 'accepted' | 'refused', response: string): NewEntry => ({
    kind: 'delivery',
    brief: briefName(job),
    group: group ?? '',
    series: '',
    period: periods,
    reason: '',
    toolVersion: brief.provenance.toolVersion,
    run: run.run,
    shard: run.shard,
    jobSha256: brief.provenance.jobSha256,
    dataSha256: '',
    message: key,
    recipient: mailbox(recipient),
    status,
    body: JSON.stringify({ file: file.path, sha256, response } satisfies DeliveryBody),
  });
  return [
    ...outcome.accepted.map((a) => entry(a, 'accepted', '')),
    ...outcome.refused.map((r) => entry(r.address, 'refused', `${r.code ?? ''} ${r.reply}`.trim())),
  ];
}
