/**
 * The few words whose presence a claim implies: a claim that the trend is rising must not sit in a
 * sentence that says it fell. Patterns are matched on the statement's text.
 */
import type { DirectionWord } from '../vocabulary/claims.js';

const RISING = /\b(up|rising|rose|higher|increase[sd]?)\b/i;
const FALLING = /\b(down|falling|fell|lower|decrease[sd]?)\b/i;
const UNCHANGED = /\bbroadly unchanged\b/i;

/** A problem with the words, or null when they agree with the direction. */
export function directionWordsProblem(text: string, d: DirectionWord | 'unknown'): string | null {
  const says = { rising: RISING.test(text), falling: FALLING.test(text), unchanged: UNCHANGED.test(text) };
  if (d === 'unknown') return says.rising || says.falling || says.unchanged ? 'gives a direction it cannot know' : null;
  if (d === 'broadly-unchanged') {
    if (!says.unchanged) return 'does not say "broadly unchanged"';
    return null;
  }
  if (says.unchanged) return `says "broadly unchanged" for a ${d} trend`;
  if (d === 'rising' && (!says.rising || says.falling)) return 'does not say the trend is up';
  if (d === 'falling' && (!says.falling || says.rising)) return 'does not say the trend is down';
  return null;
}
