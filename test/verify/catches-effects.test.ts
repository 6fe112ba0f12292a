/**
 * The verifier catches false claims about calendar effects and events (src/verify/check-effects.ts): each
 * case takes the true harbour-freight example brief (working days, a named step, a named one-off), makes
 * one claim false by hand, and expects the verifier to say so. Easter: a claim built by hand, checked
 * against Easter 2024 (31 March) and 2025 (20 April), common knowledge.
 */
import { describe, expect, test } from 'vitest';
import { verifySeries } from '../../src/verify/index.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import type { Claim } from '../../src/vocabulary/claims.js';
import { exampleBriefs } from '../narrate/examples.js';

const harbour = (await exampleBriefs()).find((b) => b.example === 'harbour-freight')?.brief.series[0] as SeriesBrief;

function tampered(kind: Claim['kind'], edit: (c: Claim, s: SeriesBrief) => void): string[] {
  const s = structuredClone(harbour);
  const st = s.statements.find((x) => x.claims.some((c) => c.kind === kind));
  if (!st) throw new Error(`no ${kind} claim`);
  edit(st.claims.find((c) => c.kind === kind) as Claim, s);
  return verifySeries(s).map((f) => f.problem);
}

describe('the verifier catches false claims about effects', () => {
  test('nothing on the true brief, which makes each kind of claim', () => {
    expect(verifySeries(harbour)).toEqual([]);
    const kinds = harbour.statements.flatMap((x) => x.claims.map((c) => c.kind));
    expect(kinds).toEqual(expect.arrayContaining(['working-days', 'level-step', 'named-event']));
  });
  test('a wrong count of working days', () => {
    const p = tampered('working-days', (c) => {
      if (c.kind === 'working-days') c.daysAt += 1;
    });
    expect(p.join('\n')).toMatch(/2026-10-01 has 22 working days \(Monday to Friday\), not 23/);
  });
  test('a change "allowing for working days" that is the raw change', () => {
    const p = tampered('working-days', (c, s) => {
      if (c.kind !== 'working-days') return;
      const o = s.components.observed;
      c.value = 100 * (o[s.reportingIndex] / o[s.reportingIndex - 12] - 1);
    });
    expect(p.join('\n')).toMatch(/allowing for the calendar; recomputed/);
  });
  test('a calendar component dropped from the components', () => {
    const p = tampered('working-days', (_c, s) => {
      s.components.calendar = undefined;
    });
    expect(p.join('\n')).toMatch(/components do not make up the observed value|no calendar component/);
  });
  test('a step said to go down', () => {
    const p = tampered('level-step', (c) => {
      if (c.kind === 'level-step') c.direction = 'down';
    });
    expect(p.join('\n')).toMatch(/says the level went down/);
  });
  test('a step of the wrong size', () => {
    const p = tampered('level-step', (c) => {
      if (c.kind === 'level-step') c.size *= 1.5;
    });
    expect(p.join('\n')).toMatch(/states a step of/);
  });
  test('a named step whose words leave out its label', () => {
    const p = tampered('level-step', (_c, s) => {
      const st = s.statements.find((x) => x.claims.some((c) => c.kind === 'level-step'))!;
      st.text = st.text.replace('Second container berth opened', 'new berth');
    });
    expect(p.join('\n')).toMatch(/do not repeat the label "Second container berth opened"/);
  });
  test('a one-off said to be above the pattern', () => {
    const p = tampered('named-event', (c) => {
      if (c.kind === 'named-event') c.direction = 'above';
    });
    expect(p.join('\n')).toMatch(/says above/);
  });
  test('Easter in the wrong months', () => {
    const s = structuredClone(harbour);
    const i = s.components.dates.indexOf('2025-04-01');
    s.reportingIndex = i;
    const st = s.statements.find((x) => x.kind === 'effects')!;
    st.claims = [{ kind: 'easter-months', year: 2025, month: 4, lastMonth: 3 }];
    expect(verifySeries(s).filter((f) => /Easter/.test(f.problem))).toEqual([]);
    st.claims = [{ kind: 'easter-months', year: 2025, month: 3, lastMonth: 4 }];
    const p = verifySeries(s)
      .map((f) => f.problem)
      .join('\n');
    expect(p).toMatch(/Easter 2025 was in month 4, not 3/);
    expect(p).toMatch(/Easter 2024 was in month 3, not 4/);
  });
});
