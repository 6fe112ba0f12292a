/**
 * The hash chain of the record: each entry's hash is SHA-256 over the previous entry's hash and every
 * field of the entry, in a fixed order, as JSON text. Changing, removing or reordering any entry changes
 * every hash after it, so verifying the chain from the first entry shows whether anything was altered
 * (the construction of a hash-linked log: Haber & Stornetta, "How to time-stamp a digital document",
 * Journal of Cryptology 3(2), 1991).
 */
import { createHash } from 'node:crypto';
import type { Entry } from './types.js';

/** The previous hash of the first entry. */
export const GENESIS = '0'.repeat(64);

/** The hash an entry must carry, from its fields and prevHash (its own hash field is ignored). */
export function entryHash(e: Omit<Entry, 'hash'>): string {
  const fields = [
    e.seq,
    e.kind,
    e.brief,
    e.group,
    e.series,
    e.period,
    e.issue,
    e.reason,
    e.recordedAt,
    e.toolVersion,
    e.run,
    e.shard,
    e.jobSha256,
    e.dataSha256,
    e.message,
    e.recipient,
    e.status,
    e.body,
    e.prevHash,
  ];
  return createHash('sha256').update(JSON.stringify(fields)).digest('hex');
}

export interface ChainCheck {
  count: number;
  /** The first entry that breaks the chain and how, or null when the chain holds. */
  broken: { seq: number; why: string } | null;
}

/** Walks the entries in order of seq: numbering, links and hashes. */
export function verifyChain(entries: Entry[]): ChainCheck {
  let prev = GENESIS;
  let expectSeq = 1;
  for (const e of entries) {
    if (e.seq !== expectSeq) {
      return {
        count: entries.length,
        broken: { seq: e.seq, why: e.seq > expectSeq ? `entry ${expectSeq} is missing` : 'entry numbers repeat' },
      };
    }
    if (e.prevHash !== prev)
      return { count: entries.length, broken: { seq: e.seq, why: 'it does not link to the entry before it' } };
    if (entryHash(e) !== e.hash)
      return { count: entries.length, broken: { seq: e.seq, why: 'its contents do not match its hash' } };
    prev = e.hash;
    expectSeq++;
  }
  return { count: entries.length, broken: null };
}
