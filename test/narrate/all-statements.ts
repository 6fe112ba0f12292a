/**
 * Every statement the tests read: those of the three examples and of the synthetic jobs, and the brief
 * cautions, each with the locale it was written in.
 */
import type { Statement } from '../../src/vocabulary/brief.js';
import { exampleBriefs } from './examples.js';
import { syntheticBriefs } from './synthetic.js';

export interface StatementCase {
  source: string;
  locale: string;
  statement: Statement;
}

export async function allStatements(): Promise<StatementCase[]> {
  const briefs = [
    ...(await exampleBriefs()).map(({ example, brief }) => ({ source: example, brief })),
    ...(await syntheticBriefs()).map(({ job, brief }) => ({ source: job.name, brief })),
  ];
  const out: StatementCase[] = [];
  for (const { source, brief } of briefs) {
    const locale = brief.meta.locale;
    for (const s of brief.series) {
      for (const statement of s.statements) out.push({ source: `${source}/${s.group ?? s.id}`, locale, statement });
    }
    for (const statement of brief.cautions) out.push({ source: `${source}/cautions`, locale, statement });
  }
  return out;
}
