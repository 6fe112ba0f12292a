/**
 * A written brief as record entries — one publication entry per series — and the record's entries of a
 * brief as what the next brief needs of them (PastIssue per series).
 */

import type { WrittenFile } from '../render/write.js';
import type { Brief, PastIssue, SeriesBrief } from '../vocabulary/brief.js';
import type { Job } from '../vocabulary/settings.js';
import type { Entry, NewEntry, PublicationBody } from './types.js';

/** How one run records: its id, its shard, and the reason the user gave for a re-issue. */
export interface RecordRun {
  run: string;
  shard: string;
  reason: string;
}

/** The brief's name in the record: record.name, else the job's title; the group is kept apart. */
export function briefName(job: Job): string {
  return job.record.name ?? job.brief.title;
}

/** Numbers as JSON can hold them: NaN and infinities become null. */
function num(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

export function publicationEntries(
  job: Job,
  group: string | null,
  brief: Brief,
  files: readonly WrittenFile[],
  run: RecordRun,
): NewEntry[] {
  // The hashes writeFiles took of the bytes it wrote: the record names exactly what is on disk.
  const written = files.map((f) => ({ path: f.path, sha256: f.sha256, bytes: f.size }));
  return brief.series.map((s) => ({
    kind: 'publication',
    brief: briefName(job),
    group: group ?? '',
    series: s.id,
    period: s.reportingDate,
    reason: run.reason,
    toolVersion: brief.provenance.toolVersion,
    run: run.run,
    shard: run.shard,
    jobSha256: brief.provenance.jobSha256,
    dataSha256: s.data.sha256,
    message: '',
    recipient: '',
    status: '',
    body: JSON.stringify(publicationBody(brief, s, written)),
  }));
}

function publicationBody(brief: Brief, s: SeriesBrief, files: PublicationBody['files']): PublicationBody {
  const a = s.analysis;
  return {
    title: brief.meta.title,
    label: s.label,
    unit: s.unit,
    frequency: s.frequency,
    figures: {
      trendYoYPercent: num(a.trendYoY.percent),
      trendYoYChange: num(a.trendYoY.change),
      adjustedYoYPercent: num(a.adjustedYoY.percent),
      rawYoYPercent: num(a.rawYoY.percent),
      adjustedPoPPercent: num(a.adjustedPoP.percent),
      trendPoPPercent: num(a.trendPoP.percent),
      reportingValue: num(s.components.observed[s.reportingIndex]),
      trendValue: num(s.components.trend[s.reportingIndex]),
      direction: a.direction,
      directionRun: a.directionRun,
      firmnessMeanAbsoluteRevision: num(a.firmness.meanAbsoluteRevision),
      firmnessRange80Low: num(a.firmness.range80[0]),
      firmnessRange80High: num(a.firmness.range80[1]),
      reversalValue: num(a.sensitivity.reversalValue),
    },
    comparisons: a.comparisons.map((c) => ({
      id: c.id,
      label: c.label,
      current: num(c.raw.current),
      baseline: num(c.raw.baseline),
      percent: num(c.raw.percent),
      adjustedPercent: num(c.adjusted.percent),
    })),
    statements: s.statements.map((st) => ({
      id: st.id,
      kind: st.kind,
      text: st.text,
      figures: st.figures.map((f) => ({
        name: f.name,
        value: typeof f.value === 'number' ? num(f.value) : f.value,
        formatted: f.formatted,
      })),
      ...('claim' in st ? { claim: (st as { claim?: unknown }).claim } : {}),
    })),
    dates: s.components.dates.slice(0, s.reportingIndex + 1),
    values: s.components.observed.slice(0, s.reportingIndex + 1).map(num),
    trendYoYPercent: num(a.trendYoY.percent),
    dataFile: s.data.file,
    jobFile: brief.provenance.jobFile,
    generatedAt: brief.provenance.generatedAt,
    files,
  };
}

/** The record's publications of one brief, by series id, as the build reads them. */
export function pastIssues(entries: Entry[]): Map<string, PastIssue[]> {
  const out = new Map<string, PastIssue[]>();
  for (const e of entries) {
    if (e.kind !== 'publication') continue;
    const b = JSON.parse(e.body) as PublicationBody;
    const list = out.get(e.series) ?? [];
    list.push({
      period: e.period,
      issue: e.issue,
      recordedAt: e.recordedAt,
      trendYoYPercent: b.trendYoYPercent ?? Number.NaN,
      trendYoYChange: typeof b.figures?.trendYoYChange === 'number' ? b.figures.trendYoYChange : Number.NaN,
      dates: b.dates,
      values: b.values.map((v) => v ?? Number.NaN),
    });
    out.set(e.series, list);
  }
  return out;
}
