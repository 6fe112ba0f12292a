/**
 * The verifier must catch false claims: each case takes a true example brief, makes one claim (or its
 * words) false by hand, and expects the verifier to say so.
 */
import { describe, expect, test } from 'vitest';
import { verifySeries } from '../../src/verify/index.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import type { Claim } from '../../src/vocabulary/claims.js';
import { exampleBriefs } from '../narrate/examples.js';

const water = (await exampleBriefs()).find((b) => b.example === 'water-deliveries')?.brief.series[0] as SeriesBrief;

function tampered(kind: Claim['kind'], edit: (c: Claim, s: SeriesBrief) => void): string[] {
  const s = structuredClone(water);
  const st = s.statements.find((x) => x.claims.some((c) => c.kind === kind));
  if (!st) throw new Error(`no ${kind} claim`);
  edit(st.claims.find((c) => c.kind === kind) as Claim, s);
  return verifySeries(s).map((f) => f.problem);
}

describe('the verifier catches', () => {
  test('nothing on the true brief', () => {
    expect(verifySeries(water)).toEqual([]);
  });
  test('a direction word the materiality rule does not give', () => {
    const p = tampered('trend-yearly-change', (c) => {
      if (c.kind === 'trend-yearly-change') c.direction = 'broadly-unchanged';
    });
    expect(p.join('\n')).toMatch(/materiality rule gives rising/);
  });
  test('a tile that contradicts the headline', () => {
    const p = tampered('trend-direction', (c) => {
      if (c.kind === 'trend-direction') c.direction = 'falling';
    });
    expect(p.join('\n')).toMatch(/while the headline says rising/);
  });
  test('a wrong peak season', () => {
    const p = tampered('seasonal-peak-low', (c) => {
      if (c.kind === 'seasonal-peak-low') c.peak.label = 'March';
    });
    expect(p.join('\n')).toMatch(/names March as the peak; the seasonal component peaks in July/);
  });
  test('a "last two years" that is not two calendar years', () => {
    const p = tampered('unusual-count', (c, s) => {
      if (c.kind === 'unusual-count')
        c.span = { ...c.span, from: s.components.dates[s.reportingIndex - 10], periods: 11 };
    });
    expect(p.join('\n')).toMatch(/the span starts/);
  });
  test('a wrong count of unusual periods', () => {
    const p = tampered('unusual-count', (c) => {
      if (c.kind === 'unusual-count') c.count += 1;
    });
    expect(p.join('\n')).toMatch(/counts \d+ unusual periods, the remainder gives/);
  });
  test('a custom baseline called "a year before" when it is not', () => {
    const p = tampered('comparison', (c, s) => {
      if (c.kind !== 'comparison') return;
      const d = s.components.dates;
      const i = d.indexOf(c.baseline.from) - 24;
      c.baseline = { from: d[i], to: d[i + c.baseline.periods - 1], periods: c.baseline.periods };
    });
    expect(p.join('\n')).toMatch(/the same span a year before/);
  });
  test('a percent of a baseline that is not positive', () => {
    const p = tampered('comparison', (c, s) => {
      if (c.kind !== 'comparison') return;
      const i = s.components.dates.indexOf(c.baseline.from);
      for (let k = i; k < i + c.baseline.periods; k++) s.components.observed[k] = -1;
    });
    expect(p.join('\n')).toMatch(/percent of a baseline of/);
  });
  test('a statement whose words say down, or broadly unchanged, for a trend that is up', () => {
    const words = (from: string, to: string) => {
      const s = structuredClone(water);
      const h = s.statements.find((x) => x.kind === 'headline');
      if (!h?.text.includes(from)) throw new Error(`no "${from}" in the headline`);
      h.text = h.text.replace(from, to);
      return verifySeries(s)
        .map((f) => f.problem)
        .join('\n');
    };
    expect(words('the trend is up', 'the trend is down')).toMatch(/does not say the trend is up/);
    expect(words('the trend is up', 'the trend is broadly unchanged')).toMatch(
      /says "broadly unchanged" for a rising trend/,
    );
  });
  test('observed values that are not the data as read', () => {
    const raw = [...water.components.observed];
    raw[3] += 1;
    expect(
      verifySeries(water, raw)
        .map((f) => f.problem)
        .join('\n'),
    ).toMatch(/the data say/);
  });
  test('a firmness range said to hold more revisions than it does', () => {
    const p = tampered('firmness', (c) => {
      if (c.kind === 'firmness') c.withinRange += 1;
    });
    expect(p.join('\n')).toMatch(/revisions lie in the range, the list has/);
  });
  test('a first estimate compared inside the provisional zone, or a revision of the wrong sign', () => {
    const p = tampered('firmness', (_c, s) => {
      const f = s.analysis.firmness;
      f.revisions[f.revisions.length - 1].index = f.provisionalFrom;
      f.revisions[0].revision = -f.revisions[0].revision;
    });
    expect(p.join('\n')).toMatch(/compared inside the provisional zone/);
    expect(p.join('\n')).toMatch(/is not later minus earlier/);
  });
  test('"the same weekday a year earlier" that is not 52 weeks back, and an ISO week that is not its twin', () => {
    const weekday = tampered('comparison', (c) => {
      if (c.kind === 'comparison') c.baselineWords = 'same-weekday';
    });
    // The water example is monthly: a month a year back is 365 or 366 days, never 364.
    expect(weekday.join('\n')).toMatch(/the same weekday a year before/);
    const week = tampered('comparison', (c, s) => {
      if (c.kind !== 'comparison') return;
      // September 2025 and September 2026 start in the same ISO week number (36); two months earlier does not.
      const d = s.components.dates;
      const i = d.indexOf(c.baseline.from) - 2;
      c.baseline = { from: d[i], to: d[i + c.baseline.periods - 1], periods: c.baseline.periods };
      c.baselineWords = 'iso-week';
    });
    expect(week.join('\n')).toMatch(/the same ISO week a year before/);
  });
  test('spans of different lengths not said to differ', () => {
    const p = tampered('comparison', (c, s) => {
      if (c.kind !== 'comparison') return;
      const d = s.components.dates;
      const i = d.indexOf(c.baseline.from) - 1;
      c.baseline = { from: d[i], to: c.baseline.to, periods: c.baseline.periods + 1 };
    });
    expect(p.join('\n')).toMatch(/not said to differ/);
  });
  test('seasonality said to be identifiable when the combined test finds none, and a wrong F', () => {
    const p = tampered('identifiable-seasonality', (c) => {
      if (c.kind !== 'identifiable-seasonality') return;
      c.verdict = 'none';
      c.stable.statistic *= 1.01;
    });
    expect(p.join('\n')).toMatch(/says seasonality is none; the combined test gives present/);
    expect(p.join('\n')).toMatch(/stable seasonality: F /);
    expect(p.join('\n')).toMatch(/names a peak for a pattern that is not identifiable/);
  });
  test('a test level other than the published one', () => {
    const p = tampered('identifiable-seasonality', (c) => {
      if (c.kind === 'identifiable-seasonality') c.levels.stable = 0.05;
    });
    expect(p.join('\n')).toMatch(/states the stable level as 0.05/);
  });
  test('a season left in the components of a brief that says the data are not adjusted', () => {
    const p = tampered('identifiable-seasonality', (c, s) => {
      if (c.kind !== 'identifiable-seasonality') return;
      c.adjusted = false;
      s.settings.seasonalAdjustment = { applied: false, reason: 'tampered' };
    });
    expect(p.join('\n')).toMatch(/an identifiable pattern was not removed/);
    expect(p.join('\n')).toMatch(/unadjusted, yet the components carry a season/);
  });
  test('residual seasonality said to be absent when the F test finds it at the stated level', () => {
    const p = tampered('residual-seasonality', (c) => {
      if (c.kind === 'residual-seasonality') c.level = 0.999;
    });
    expect(p.join('\n')).toMatch(/says seasonality is not left/);
  });
});
