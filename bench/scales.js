// Our chart scales (src/chart/scale-*.ts) against d3-scale 4 / d3-time 3, the library they follow:
// agreement of tick values, nice domains, time ticks and bands on many domains, the cost of importing
// each in a fresh process, and the speed of the tick rule. Prints ratios within one run (node bench/scales.js
// after npm run build); the results are in DEVELOPERS.md ("Scales: ours or d3's").
import { execFileSync } from 'node:child_process';
import { scaleBand, scaleLinear, scaleUtc } from 'd3-scale';
import { utcMonday, utcSunday, utcTickInterval } from 'd3-time';
import { bandScale } from '../dist/chart/scale-band.js';
import { niceDomain, ticks } from '../dist/chart/scale-linear.js';
import { timeTicks } from '../dist/chart/scale-time.js';

let seed = 12345;
const rand = () => {
  seed = (seed * 16807) % 2147483647; // Park & Miller (1988) minimal standard generator
  return seed / 2147483647;
};
const same = (a, b) =>
  a.length === b.length && a.every((v, i) => Math.abs(v - b[i]) <= 1e-12 * Math.max(1, Math.abs(v)));

// 1. Linear ticks and nice domains.
let linearCases = 0;
let tickDiffer = 0;
let niceDiffer = 0;
for (let k = 0; k < 20000; k++) {
  const scale = 10 ** Math.floor(rand() * 12 - 4);
  const lo = (rand() - 0.3) * scale;
  const hi = lo + rand() * scale + 1e-9;
  const count = 2 + Math.floor(rand() * 12);
  linearCases++;
  const [n0, n1] = niceDomain(lo, hi, count);
  const d3 = scaleLinear().domain([lo, hi]).nice(count);
  if (!same([n0, n1], d3.domain())) niceDiffer++;
  if (!same(ticks(n0, n1, count), d3.ticks(count))) tickDiffer++;
}
console.log(`linear: ${linearCases} domains; nice domain differs on ${niceDiffer}, ticks differ on ${tickDiffer}`);

// 2. Time ticks, hourly to decades; d3 weeks start on Sunday, ours on Monday (ISO 8601).
let timeCases = 0;
let timeDiffer = 0;
let weekly = 0;
let weeklyMondayAgree = 0;
const HOUR = 3_600_000;
for (let k = 0; k < 5000; k++) {
  const start = Date.UTC(1990, 0, 1) + Math.floor(rand() * 35 * 8760) * HOUR;
  const span = Math.floor(10 ** (rand() * 5.3)) * HOUR; // an hour to about 23 years
  const count = 4 + Math.floor(rand() * 12);
  timeCases++;
  const ours = timeTicks(start, start + span, count).values;
  const d3 = scaleUtc()
    .domain([new Date(start), new Date(start + span)])
    .ticks(count)
    .map(Number);
  if (!same(ours, d3)) {
    timeDiffer++;
    const interval = utcTickInterval(new Date(start), new Date(start + span), count);
    if (interval === utcSunday) {
      weekly++;
      const monday = utcMonday.range(new Date(start), new Date(start + span + 1)).map(Number);
      if (same(ours, monday)) weeklyMondayAgree++;
    }
  }
}
console.log(
  `time: ${timeCases} spans; ticks differ on ${timeDiffer}, of which ${weekly} are weekly steps (${weeklyMondayAgree} equal to d3-time's utcMonday)`,
);

// 3. Bands.
let bandDiffer = 0;
for (let n = 1; n <= 60; n++) {
  const ours = bandScale(n, 40, 640);
  const d3 = scaleBand()
    .domain(Array.from({ length: n }, (_, i) => i))
    .range([40, 640])
    .paddingInner(0.1)
    .paddingOuter(0.05);
  const starts = Array.from({ length: n }, (_, i) => ours.start(i));
  if (
    !same(
      starts,
      starts.map((_, i) => d3(i)),
    ) ||
    Math.abs(ours.bandwidth - d3.bandwidth()) > 1e-9
  )
    bandDiffer++;
}
console.log(`band: 60 band counts; differ on ${bandDiffer}`);

// 4. Import cost in a fresh process, alternating, median of 7 each.
const importMs = (code) =>
  Number(
    execFileSync(
      process.execPath,
      ['--input-type=module', '-e', `const t=performance.now();${code};console.log(performance.now()-t)`],
      {
        cwd: new URL('..', import.meta.url),
      },
    ),
  );
const oursCode =
  "await import('./dist/chart/scale-linear.js');await import('./dist/chart/scale-time.js');await import('./dist/chart/scale-band.js')";
const d3Code = "await import('d3-scale');await import('d3-time')";
const a = [];
const b = [];
for (let i = 0; i < 7; i++) {
  a.push(importMs(oursCode));
  b.push(importMs(d3Code));
}
const median = (v) => v.sort((x, y) => x - y)[v.length >> 1];
console.log(
  `import: ours ${median(a).toFixed(1)} ms, d3-scale + d3-time ${median(b).toFixed(1)} ms (ratio ${(median(b) / median(a)).toFixed(1)})`,
);

// 5. Speed of a value axis: nice domain and ticks, 200,000 times, alternating.
const speed = (f) => {
  const t = performance.now();
  let s = 0;
  for (let k = 0; k < 200000; k++) s += f(k * 0.37, k * 0.37 + 1000 + (k % 97), 5);
  return [performance.now() - t, s];
};
const oursAxis = (lo, hi, c) => {
  const [n0, n1] = niceDomain(lo, hi, c);
  return ticks(n0, n1, c).length;
};
const d3Axis = (lo, hi, c) => scaleLinear().domain([lo, hi]).nice(c).ticks(c).length;
const ta = [];
const tb = [];
for (let i = 0; i < 5; i++) {
  ta.push(speed(oursAxis)[0]);
  tb.push(speed(d3Axis)[0]);
}
console.log(`axis speed: d3 / ours = ${(median(tb) / median(ta)).toFixed(2)} (median of 5 alternating runs)`);
