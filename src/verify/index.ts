/**
 * The verifier: checks every claim of every statement of a brief against the components and the data.
 * It shares no code with src/narrate/ (nor with src/analyse/): what it knows of calendars, quantiles and
 * spans it computes itself, so a fault in the narrator or the analysis is not repeated here.
 *
 *   verifyBrief(brief) → [] when every claim is true; otherwise one Finding per false claim.
 */
import type { Brief, SeriesBrief } from '../vocabulary/brief.js';
import type { Claim, ClaimKind } from '../vocabulary/claims.js';
import { CHECKS, type Check } from './checks.js';
import { contextFor } from './context.js';
import { checkIdentities } from './identities.js';

export interface Finding {
  series: string;
  statement: string;
  claim: string;
  problem: string;
  text: string;
}

export function verifySeries(s: SeriesBrief, raw?: ArrayLike<number>): Finding[] {
  const out: Finding[] = [];
  for (const problem of checkIdentities(s, raw)) {
    out.push({ series: s.id, statement: '(components)', claim: 'identity', problem, text: '' });
  }
  for (const st of s.statements) {
    if (!Array.isArray(st.claims) || st.claims.length === 0) {
      out.push({ series: s.id, statement: st.id, claim: '(none)', problem: 'carries no claim', text: st.text });
      continue;
    }
    const ctx = contextFor(s, st);
    for (const c of st.claims) {
      const check = CHECKS[c.kind] as Check<ClaimKind> | undefined;
      if (!check) {
        out.push({ series: s.id, statement: st.id, claim: c.kind, problem: 'has no check', text: st.text });
        continue;
      }
      let problems: string[];
      try {
        problems = check(c as Claim, ctx);
      } catch (e) {
        problems = [`check failed: ${(e as Error).message}`];
      }
      for (const problem of problems)
        out.push({ series: s.id, statement: st.id, claim: c.kind, problem, text: st.text });
    }
  }
  return out;
}

export function verifyBrief(brief: Brief): Finding[] {
  const out = brief.series.flatMap((s) => verifySeries(s));
  for (const c of brief.cautions) {
    if (c.claims.some((x) => x.kind !== 'none')) {
      out.push({
        series: '(brief)',
        statement: c.id,
        claim: 'caution',
        problem: 'a caution makes a claim',
        text: c.text,
      });
    }
  }
  return out;
}

/** One line per finding, for test failures and the command line. */
export function describeFindings(findings: Finding[]): string {
  return findings.map((f) => `${f.series} ${f.statement} [${f.claim}]: ${f.problem} — "${f.text}"`).join('\n');
}
