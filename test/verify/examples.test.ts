/**
 * The verifier over every example brief: every claim of every statement must be true of the data.
 */
import { describe, expect, it } from 'vitest';
import { describeFindings, verifyBrief } from '../../src/verify/index.js';
import { exampleBriefs } from '../narrate/examples.js';

describe('every claim of the examples is true', () => {
  it('finds no false claim', async () => {
    const briefs = await exampleBriefs();
    expect(briefs.length).toBeGreaterThan(0);
    const findings = briefs.flatMap(({ brief }) => verifyBrief(brief));
    expect(describeFindings(findings)).toBe('');
  });
});
