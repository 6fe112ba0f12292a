/**
 * Job → Brief: load each series' data, cut it at the reporting period, resolve the settings once,
 * decompose, diagnose, analyse, narrate and chart. One brief per group when the job splits its data by a
 * column; a group that fails does not stop the others.
 */
import { createHash } from 'node:crypto';
import { type LoadedData, type LoadedGroup, loadData } from '../data/load.js';
import { QueryError } from '../data/query-error.js';
import { BriefError } from '../errors.js';
import { queryErrorInJob } from '../job/place.js';
import { briefCautions } from '../narrate/statements.js';
import type { Brief, BriefMeta, PastIssue, Provenance, SeriesBrief, SeriesHead } from '../vocabulary/brief.js';
import type { Job, SeriesSpec } from '../vocabulary/settings.js';
import { canShareSeries, dropSeriesWorker } from './early-worker.js';
import { readLogo } from './logo.js';
import { buildSeriesWithCharts, reportingCut, type SeriesWork } from './series.js';
import { briefTitle } from './title.js';

export type { SeriesWork } from './series.js';

export interface BuildOptions {
  /** Overrides the job's reporting period (e.g. from --period). */
  period?: string | null;
  toolVersion: string;
  /** Draw the charts (false for the json format alone, which does not need them). */
  charts: boolean;
  /** Seconds since the epoch to stamp the brief with; from SOURCE_DATE_EPOCH when set. */
  epoch?: number | null;
  /** Build only these groups (null is the brief of a job without groups); all when absent. */
  groups?: (string | null)[];
  /** Data already loaded for this job (a batch worker keeps it between briefs of one job). */
  cache?: Map<string, LoadedData>;
  /** Told of each brief's parts as they are ready, so a renderer can start before the last series is built. */
  progress?: BriefProgress;
  /** What earlier briefs published, by series id (read from the record by the caller). */
  past?: Map<string, PastIssue[]>;
}

/**
 * What a caller hears while one brief is built. `start` comes first, with the brief's meta, its provenance
 * and each series' label and reporting period; while it runs (it may be slow, e.g. load a renderer) the
 * series are already being built on the second thread. Then `series` comes once per series, in the job's
 * order, as soon as that series and all before it are built. A brief that fails stops the calls (the error
 * comes from buildBriefs as without progress); `start` is skipped when a series' reporting period is
 * itself in error.
 */
export interface BriefProgress {
  start(meta: BriefMeta, provenance: Provenance, heads: SeriesHead[]): Promise<void>;
  series(s: SeriesBrief): void;
}

export interface BriefUnit {
  /** The group this brief is for, or null. */
  group: string | null;
  brief: Brief | null;
  error: BriefError | null;
}

export async function buildBriefs(job: Job, options: BuildOptions): Promise<BriefUnit[]> {
  const loaded = loadJobData(job, options.cache, options.period);
  const wanted = options.groups;
  const units: BriefUnit[] = [];
  for (const group of groupsOf(loaded)) {
    if (wanted && !wanted.includes(group)) continue;
    try {
      units.push({ group, brief: await buildOne(job, loaded, group, options), error: null });
    } catch (e) {
      if (!(e instanceof BriefError)) throw e;
      units.push({ group, brief: null, error: e });
    }
  }
  for (const [group, error] of failedGroupsOf(loaded))
    if (!wanted || wanted.includes(group)) units.push({ group, brief: null, error });
  return units;
}

/**
 * Every series' data, read once (or taken from the cache, keyed by dataKey). `period` overrides the job's
 * reporting period (--period), for a database query's parameters.
 */
export function loadJobData(
  job: Job,
  cache?: Map<string, LoadedData>,
  period?: string | null,
): Map<SeriesSpec, LoadedData> {
  const loaded = new Map<SeriesSpec, LoadedData>();
  const reporting = period ?? job.brief.period;
  job.series.forEach((spec, i) => {
    const key = dataKey(spec, reporting);
    let data = cache?.get(key);
    if (!data) {
      try {
        data = loadData(spec.data, spec.frequency, reporting);
      } catch (e) {
        // A query's error is shown at the query in the job file, on the line the database points at.
        throw e instanceof QueryError ? queryErrorInJob(e, job, i) : e;
      }
      cache?.set(key, data);
    }
    loaded.set(spec, data);
  });
  return loaded;
}

/**
 * How loadJobData's cache names a series' data: the data settings and the frequency that read it, and the
 * reporting period when a query's parameters depend on it.
 */
export function dataKey(spec: SeriesSpec, period: string | null = null): string {
  const byPeriod = (spec.data.parameters?.length ?? 0) > 0;
  return JSON.stringify(byPeriod ? [spec.data, spec.frequency, period] : [spec.data, spec.frequency]);
}

/**
 * The data one brief needs, as a cache for loadJobData: each series' data with only that group's series (or
 * its one series when the data is not split). A batch reads a job's data once and hands each brief this
 * much, rather than every worker reading every group.
 */
export function dataOfGroup(
  loaded: Map<SeriesSpec, LoadedData>,
  group: string | null,
  period: string | null = null,
): Map<string, LoadedData> {
  const out = new Map<string, LoadedData>();
  for (const [spec, data] of loaded) {
    const g = groupIn(data, group);
    out.set(dataKey(spec, period), { ...data, groups: g ? [g] : [], failedGroups: [] });
  }
  return out;
}

/** The group's series in a series' data; the one series of data that is not split serves every group. */
function groupIn(data: LoadedData, group: string | null): LoadedGroup | null {
  return (
    data.groups.find((x) => x.key === group) ??
    (data.groups.length === 1 && data.groups[0].key === null ? data.groups[0] : null)
  );
}

/** The briefs a job yields: one per group value (first seen first), or one brief (null) without groups. */
export function groupsOf(loaded: Map<SeriesSpec, LoadedData>): (string | null)[] {
  const failed = failedGroupsOf(loaded);
  const groups: string[] = [];
  const seen = new Set<string>();
  for (const data of loaded.values()) {
    for (const g of data.groups) {
      if (g.key === null || seen.has(g.key)) continue;
      seen.add(g.key);
      if (!failed.has(g.key)) groups.push(g.key);
    }
  }
  return groups.length > 0 || failed.size > 0 ? groups : [null];
}

/**
 * The groups whose data are wrong in any of the job's data files, each with the first error found: their
 * briefs fail, the others go on (a group is never built without one of its series).
 */
export function failedGroupsOf(loaded: Map<SeriesSpec, LoadedData>): Map<string, BriefError> {
  const failed = new Map<string, BriefError>();
  for (const data of loaded.values())
    for (const f of data.failedGroups ?? []) if (!failed.has(f.key)) failed.set(f.key, f.error);
  return failed;
}

async function buildOne(
  job: Job,
  loaded: Map<SeriesSpec, LoadedData>,
  group: string | null,
  options: BuildOptions,
): Promise<Brief> {
  const meta = briefMeta(job, group);
  const work: SeriesWork[] = [];
  for (const [spec, data] of loaded) {
    const g = groupIn(data, group);
    if (g) work.push({ spec, data, g, past: options.past?.get(spec.id) ?? [] });
  }
  const period = options.period ?? job.brief.period;
  const epoch = options.epoch ?? sourceDateEpoch();
  const provenance: Provenance = {
    tool: 'trendbrief',
    toolVersion: options.toolVersion,
    jobFile: job.file,
    jobSha256: job.sha256,
    generatedAt: new Date(epoch !== null ? epoch * 1000 : Date.now()).toISOString(),
  };
  const progress = options.progress;
  const heads = progress ? seriesHeads(job, work, period) : null;
  const start = progress && heads ? () => progress.start(meta, provenance, heads) : null;
  const ready = progress && heads ? progress.series.bind(progress) : null;
  const series: SeriesBrief[] = [];
  if (options.charts && work.length >= PARALLEL_SERIES && canShareSeries()) {
    const { buildSeriesShared } = await import('./share.js');
    series.push(...(await buildSeriesShared(job, work, period, meta.locale, { start, ready })));
  } else {
    dropSeriesWorker();
    await start?.();
    for (const w of work) {
      series.push(await buildSeriesWithCharts(job, w, period, meta.locale, options.charts));
      ready?.(series[series.length - 1]);
    }
  }
  if (series.length === 0) {
    throw new BriefError('group-empty', `no series has data for group "${group}"`, 'check the group_by column values', {
      file: job.file,
    });
  }
  return {
    meta,
    provenance,
    series,
    cautions: briefCautions(meta),
  };
}

/**
 * Briefs with this many series build them on two threads (share.ts), where two are used at all
 * (early-worker.ts seriesThreads). The second thread needs about a quarter of a second from its start to its
 * first finished series (loading and warming up the build and chart stack; measured on bench/brief-12.yaml,
 * started early by cli/batch.ts), and a series then costs 15–40 ms, so a brief of fewer series does not win
 * the start-up back.
 */
export const PARALLEL_SERIES = 6;

/** SOURCE_DATE_EPOCH (reproducible-builds.org) in seconds, or null when unset. */
export function sourceDateEpoch(): number | null {
  const v = process.env.SOURCE_DATE_EPOCH;
  if (v === undefined || v === '') return null;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 0) {
    throw new BriefError(
      'bad-epoch',
      `SOURCE_DATE_EPOCH is "${v}", not a whole number of seconds`,
      'set it to e.g. $(date +%s), or unset it',
    );
  }
  return n;
}

function briefMeta(job: Job, group: string | null): BriefMeta {
  const b = job.brief;
  return {
    title: briefTitle(b.title, group),
    organisation: b.organisation,
    author: b.author,
    contact: b.contact,
    locale: b.locale,
    fiscalYearStartMonth: b.fiscalYearStartMonth,
    accentColour: b.accentColour,
    logo: b.logo ? readLogo(b.logo, b.logo) : null,
    pageSize: b.pageSize,
    layout: b.layout,
  };
}

/** Each series' label and reporting period, or null when any of them is in error (the build reports it). */
function seriesHeads(job: Job, work: SeriesWork[], period: string | null): SeriesHead[] | null {
  if (work.length === 0) return null;
  try {
    return work.map((w) => {
      const { n } = reportingCut(job, w.spec, w.data, w.g, period);
      return {
        id: w.spec.id,
        label: w.spec.label,
        frequency: w.data.frequency,
        reportingDate: w.g.dates[n - 1],
        periodIndex: { frequency: w.data.frequency, start: w.g.series.index.start, length: n },
        reportingIndex: n - 1,
      };
    });
  } catch {
    return null;
  }
}

/** Short SHA-256 for page furniture: the first 12 hex digits of the hash of all data hashes. */
export function dataFingerprint(brief: Brief): string {
  const h = createHash('sha256');
  for (const s of brief.series) h.update(s.data.sha256);
  return h.digest('hex').slice(0, 12);
}
