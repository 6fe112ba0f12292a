/**
 * One statement from text and figure parts: its text is the parts joined, its figures those parts that are
 * figures (each name once), so every number it prints is one of its figures' formatted strings.
 */

import type { Figure, Statement, StatementKind } from '../vocabulary/brief.js';
import type { Claim } from '../vocabulary/claims.js';

/** A piece of a sentence: plain text, or a figure printed as formatted. */
export type Part = string | Figure;

export function statement(
  id: string,
  kind: StatementKind,
  parts: Part[],
  claims: Claim[] = [{ kind: 'none' }],
): Statement {
  let text = '';
  const figures: Figure[] = [];
  for (const p of parts) {
    if (typeof p === 'string') text += p;
    else {
      text += p.formatted;
      if (!figures.some((f) => f.name === p.name)) figures.push(p);
    }
  }
  // Collapse only ordinary white space: the no-break spaces Intl puts in "1 234" and "4,3 %" must stay,
  // so that a number is never broken across lines and the text still holds each figure as formatted.
  return { id, kind, text: text.replace(/[ \t\r\n]+/g, ' ').replace(/^ | $/g, ''), figures, claims };
}
