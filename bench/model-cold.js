/**
 * Cold model work: in this fresh process, automatic selection once on each series of
 * test/model/fixtures/auto-arima.json; prints the CPU milliseconds of that work alone. Run it in
 * alternation against another build (its folder as the argument) and compare as ratios, e.g.
 *
 *   for i in 1 2 3 4 5 6; do node bench/model-cold.js; node bench/model-cold.js ../other-build; done
 *
 * (bench/MODEL-SPEED.md, "The likelihood as a WebAssembly kernel").
 */
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = join(dirname(fileURLToPath(import.meta.url)), '..');
const root = resolve(process.argv[2] ?? here);
const { autoArima } = await import(pathToFileURL(join(root, 'dist/model/auto-arima.js')).href);
const fixture = JSON.parse(readFileSync(join(here, 'test/model/fixtures/auto-arima.json'), 'utf8'));
const series = fixture.cases.map((c) => [Float64Array.from(c.values, (v) => (v === null ? Number.NaN : v)), c.period]);
const start = process.cpuUsage();
for (const [y, period] of series) autoArima(y, period);
const used = process.cpuUsage(start);
console.log(((used.user + used.system) / 1000).toFixed(0));
