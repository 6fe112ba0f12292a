/**
 * The date of Easter Sunday in the Gregorian calendar, as days since 1970-01-01, by the "Anonymous
 * Gregorian algorithm" (first published in Nature, 20 April 1876; as given by Meeus, Astronomical
 * Algorithms, 2nd ed. (1998), ch. 8, valid for every Gregorian year).
 *
 *   easterSunday(2024) → the day of 2024-03-31;  easterSunday(2025) → 2025-04-20
 */
export function easterSunday(year: number): number {
  const a = year % 19;
  const b = Math.floor(year / 100);
  const c = year % 100;
  const d = Math.floor(b / 4);
  const e = b % 4;
  const f = Math.floor((b + 8) / 25);
  const g = Math.floor((b - f + 1) / 3);
  const h = (19 * a + b - d - g + 15) % 30;
  const i = Math.floor(c / 4);
  const k = c % 4;
  const l = (32 + 2 * e + 2 * i - h - k) % 7;
  const m = Math.floor((a + 11 * h + 22 * l) / 451);
  const month = Math.floor((h + l - 7 * m + 114) / 31);
  const day = ((h + l - 7 * m + 114) % 31) + 1;
  return Date.UTC(year, month - 1, day) / 86_400_000;
}
