/**
 * The record as one brief's run uses it: opened once per thread and kept for the run, read before the
 * brief is built (what earlier briefs published), written after its files are (what this one published).
 * A record that cannot be opened or written costs one line and the brief is still written, unless the job
 * sets record.required, when the brief fails instead.
 */

import { BriefError } from '../errors.js';
import type { PastIssue } from '../vocabulary/brief.js';
import type { Job } from '../vocabulary/settings.js';
import { briefName, pastIssues } from './publication.js';
import { openRecord, placeOf, type RecordPlace, type RecordStore } from './store.js';

const open = new Map<string, Promise<RecordStore>>();

function keyOf(place: RecordPlace): string {
  return place.store === 'sqlite' ? `sqlite:${place.file}` : `postgres:${place.env}:${process.env[place.env] ?? ''}`;
}

/** The job's record, opened for writing (once per thread and place); null when the job records nothing. */
export async function recordOf(job: Job, toolVersion: string): Promise<RecordStore | null> {
  const place = placeOf(job.record);
  if (!place) return null;
  const key = keyOf(place);
  let p = open.get(key);
  if (!p) {
    p = openRecord(place, { toolVersion, write: true });
    open.set(key, p);
    // A record that failed to open is tried again by the next brief (the lock may have gone).
    p.catch(() => open.delete(key));
  }
  return p;
}

/** Closes every record this thread opened (the end of a run). */
export async function closeRecords(): Promise<void> {
  const all = [...open.values()];
  open.clear();
  for (const p of all) await p.then((s) => s.close()).catch(() => undefined);
}

/** What one brief's run knows of the record: the store (or null) and the line to show when it failed. */
export interface BriefRecord {
  store: RecordStore | null;
  past: Map<string, PastIssue[]>;
  notes: string[];
}

/** Opens the record and reads what earlier briefs of this name and group published. */
export async function beginRecord(job: Job, group: string | null, toolVersion: string): Promise<BriefRecord> {
  try {
    const store = await recordOf(job, toolVersion);
    if (!store) return { store: null, past: new Map(), notes: [] };
    const entries = await store.entries({ kind: 'publication', brief: briefName(job), group: group ?? '' });
    return { store, past: pastIssues(entries), notes: [] };
  } catch (e) {
    return failed(job, e);
  }
}

/** A record failure: thrown when the job requires recording, else one note and no record. */
export function failed(job: Job, e: unknown): BriefRecord {
  if (!(e instanceof BriefError)) throw e;
  if (job.record.required) throw e;
  return { store: null, past: new Map(), notes: [`not recorded: ${e.oneLine()}`] };
}
