/**
 * Names the job file once accepted and no longer does: each is reported where it is written, with the
 * name that replaced it, instead of the schema's general complaint about an unknown value.
 */
import type { JobPath, Problem } from './schema.js';

/** Old comparison kinds and the names that replaced them. */
export const RENAMED_COMPARISONS: Record<string, string> = {
  same_period_last_year: 'year_on_year',
  rolling_12: 'latest_year',
};

export function renamedProblems(data: unknown): Problem[] {
  const job = data !== null && typeof data === 'object' ? (data as Record<string, unknown>) : null;
  const list = Array.isArray(job?.comparisons) ? job.comparisons : [];
  const out: Problem[] = [];
  list.forEach((c, i) => {
    const path: JobPath = ['comparisons', i];
    if (typeof c === 'string' && RENAMED_COMPARISONS[c]) out.push(renamed(path, 'value', c));
    else if (c !== null && typeof c === 'object' && !Array.isArray(c)) {
      for (const key of Object.keys(c)) {
        if (RENAMED_COMPARISONS[key]) out.push(renamed([...path, key], 'key', key));
      }
    }
  });
  return out;
}

function renamed(path: JobPath, at: 'value' | 'key', old: string): Problem {
  const now = RENAMED_COMPARISONS[old];
  return {
    code: 'job-renamed',
    path,
    at,
    message: `the comparison "${old}" is now called "${now}"`,
    hint: `write ${now} instead of ${old}`,
  };
}
