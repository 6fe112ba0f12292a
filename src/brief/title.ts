/** A brief's title: the job's, and for a job split by a column, the group after a dash. */
export function briefTitle(title: string, group: string | null): string {
  return group === null ? title : `${title} — ${group}`;
}
