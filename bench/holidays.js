/**
 * `npm run build && node bench/holidays.js [rounds]`: what the public holidays cost a brief that asks for
 * them, in fresh processes, alternating (the machine is shared, so only ratios within one run mean much):
 *   a. import dist/calendar/holidays.js only (what a brief without holidays pays: the module, not the library)
 *   b. the same, then checkHolidayRegion('GB-ENG') (loads date-holidays and its rules), then
 *      publicHolidays('GB-ENG', 1990, 2040)
 *   c. the same for 'DE-BY' and 'US' too (a second and third region, library already loaded), then
 *      'GB-ENG' 1990–2040 again (kept from the first call)
 * Each process reports its own times (performance.now) and how many CommonJS modules it loaded.
 * Results go to bench/HOLIDAYS.md by hand.
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

const root = join(import.meta.dirname, '..');
const rounds = Number(process.argv[2] ?? 7);
const probe = `
import { createRequire } from 'node:module';
const cache = createRequire(import.meta.url).cache;
const t0 = performance.now();
const m = await import(${JSON.stringify(pathToFileURL(join(root, 'dist/calendar/holidays.js')).href)});
const t1 = performance.now();
const before = Object.keys(cache).length;
let load = 0, first = 0, more = 0, again = 0, days = 0;
if (process.argv[1] !== 'a') {
  const l = performance.now();
  m.checkHolidayRegion('GB-ENG');
  load = performance.now() - l;
  const a = performance.now();
  days += m.publicHolidays('GB-ENG', 1990, 2040).days.size;
  first = performance.now() - a;
  if (process.argv[1] === 'c') {
    const b = performance.now();
    days += m.publicHolidays('DE-BY', 1990, 2040).days.size + m.publicHolidays('US', 1990, 2040).days.size;
    more = performance.now() - b;
    const c = performance.now();
    days += m.publicHolidays('GB-ENG', 1990, 2040).days.size;
    again = performance.now() - c;
  }
}
console.log(JSON.stringify({ importMs: t1 - t0, loadMs: load, firstMs: first, moreMs: more, againMs: again, modules: Object.keys(cache).length - before, days }));
`;
const runs = { a: [], b: [], c: [] };
for (let r = 0; r < rounds; r++) {
  for (const kind of ['a', 'b', 'c']) {
    const p = spawnSync(process.execPath, ['--input-type=module', '-e', probe, kind], { cwd: root, encoding: 'utf8' });
    if (p.status !== 0) throw new Error(p.stderr);
    runs[kind].push(JSON.parse(p.stdout));
  }
}
const median = (xs) => [...xs].sort((x, y) => x - y)[Math.floor(xs.length / 2)];
const show = (kind, key) => median(runs[kind].map((x) => x[key])).toFixed(1);
console.log(`rounds ${rounds} (medians)`);
console.log(`a. import holidays.js only:      ${show('a', 'importMs')} ms, ${runs.a[0].modules} CommonJS modules`);
console.log(`b. loading the library:           ${show('b', 'loadMs')} ms`);
console.log(
  `b. first call, GB-ENG 1990–2040: ${show('b', 'firstMs')} ms, ${runs.b[0].modules} CommonJS modules, ${runs.b[0].days} days`,
);
console.log(`c. DE-BY and US after it:         ${show('c', 'moreMs')} ms`);
console.log(`c. GB-ENG 1990–2040 again (kept):  ${show('c', 'againMs')} ms`);
console.log(
  `ratio first call / import:        ${(median(runs.b.map((x) => x.firstMs)) / median(runs.a.map((x) => x.importMs))).toFixed(1)}`,
);
