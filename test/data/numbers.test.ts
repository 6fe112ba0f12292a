import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type NumberProblem, parseNumber } from '../../src/data/numbers.js';

const problem = (r: number | NumberProblem): NumberProblem => {
  if (typeof r === 'number') throw new Error(`expected a problem, got ${r}`);
  return r;
};

// The written forms are the usual ones of the locales named (CLDR number patterns, common practice):
// en 1,234.5; de 1.234,5; fr 1 234,5 with a narrow no-break space U+202F; en-IN 12,34,567.
describe('parseNumber with decimal "."', () => {
  it('reads plain numbers, signs and exponents', () => {
    expect(parseNumber('1234.5', '.')).toBe(1234.5);
    expect(parseNumber('-3', '.')).toBe(-3);
    expect(parseNumber('+3', '.')).toBe(3);
    expect(parseNumber('.5', '.')).toBe(0.5);
    expect(parseNumber('1.5e3', '.')).toBe(1500);
    expect(parseNumber('2E-2', '.')).toBe(0.02);
    expect(parseNumber('  42 ', '.')).toBe(42);
    expect(parseNumber('\u221212.5', '.')).toBe(-12.5); // Unicode minus sign
  });

  it('reads thousands separators in groups of three', () => {
    expect(parseNumber('1,234.5', '.')).toBe(1234.5);
    expect(parseNumber('-1,234,567', '.')).toBe(-1234567);
    expect(parseNumber('1 234.5', '.')).toBe(1234.5);
    expect(parseNumber('1\u00a0234.5', '.')).toBe(1234.5);
    expect(parseNumber('1\u202f234.5', '.')).toBe(1234.5);
    expect(parseNumber('12,34,567.5', '.')).toBe(1234567.5); // Indian grouping
  });

  it('refuses malformed grouping, with a hint when it reads as a decimal comma', () => {
    const p = problem(parseNumber('1,5', '.'));
    expect(p.problem).toBe('"1,5" is not a number');
    expect(p.hint).toContain('decimal comma');
    expect(problem(parseNumber('1.234,5', '.')).hint).toContain('decimal comma');
    expect(problem(parseNumber('1,23,4', '.')).problem).toContain('not a number');
    expect(problem(parseNumber('1,234 567', '.')).problem).toContain('not a number'); // two separators mixed
    expect(problem(parseNumber('1234,567.8', '.')).problem).toContain('not a number'); // first group of four
  });

  it('treats empty cells and NA spellings as missing (NaN)', () => {
    for (const t of ['', '  ', 'NA', 'na', 'N/A', 'NaN', 'null', 'NULL']) expect(parseNumber(t, '.'), t).toBeNaN();
  });

  it('refuses infinities, other text and magnitudes above 1e15', () => {
    expect(problem(parseNumber('Infinity', '.')).problem).toContain('not a finite number');
    expect(problem(parseNumber('-inf', '.')).problem).toContain('not a finite number');
    const p = problem(parseNumber('12a', '.'));
    expect(p.problem).toBe('"12a" is not a number');
    expect(p.hint).toContain('1234.5');
    expect(problem(parseNumber('12%', '.')).hint).toContain('%');
    expect(problem(parseNumber('-', '.')).problem).toContain('not a number');
    expect(problem(parseNumber('1.2.3', '.')).problem).toContain('not a number');
    expect(problem(parseNumber('0x10', '.')).problem).toContain('not a number');
    expect(parseNumber('1000000000000000', '.')).toBe(1e15);
    expect(problem(parseNumber('1000000000000001', '.')).problem).toContain('too large');
    expect(problem(parseNumber('1e16', '.')).problem).toContain('too large');
  });
});

describe('parseNumber with decimal ","', () => {
  it('reads decimal commas with "." or space grouping', () => {
    expect(parseNumber('1234,5', ',')).toBe(1234.5);
    expect(parseNumber('1.234,5', ',')).toBe(1234.5);
    expect(parseNumber('1 234,5', ',')).toBe(1234.5);
    expect(parseNumber('1\u202f234,5', ',')).toBe(1234.5);
    expect(parseNumber('\u22121.234.567,25', ',')).toBe(-1234567.25);
    expect(parseNumber('1.234', ',')).toBe(1234); // a lone group of three is grouping under ","
  });

  it('hints at a decimal point when one is written', () => {
    const p = problem(parseNumber('12.5', ','));
    expect(p.hint).toContain('decimal point');
    expect(problem(parseNumber('1,234.5', ',')).hint).toContain('decimal point');
    expect(problem(parseNumber('12a', ',')).hint).toContain('1234,5');
  });
});

describe('parseNumber round trip (property)', () => {
  it('reads back what Intl writes for en-US and de-DE', () => {
    const en = new Intl.NumberFormat('en-US', { maximumFractionDigits: 2 });
    const de = new Intl.NumberFormat('de-DE', { maximumFractionDigits: 2 });
    fc.assert(
      fc.property(fc.integer({ min: -1e12, max: 1e12 }), fc.integer({ min: 0, max: 99 }), (whole, cents) => {
        const v = whole + Math.sign(whole || 1) * (cents / 100);
        const rounded = Number(v.toFixed(2));
        // Intl writes the hyphen-minus for these locales; swap in U+2212 on half the cases.
        const enText = en.format(rounded);
        expect(parseNumber(cents % 2 ? enText.replace('-', '\u2212') : enText, '.')).toBeCloseTo(rounded, 6);
        expect(parseNumber(de.format(rounded), ',')).toBeCloseTo(rounded, 6);
      }),
      { numRuns: 300 },
    );
  });
});
