/**
 * `node bench/load-source.js ROOT SPEC_JSON`: one source read into the series model by the built data stage
 * (ROOT/dist/data/load.js loadData), in a fresh process so bench/sources.js can time it and take its peak
 * memory. Prints the number of periods and the sum of the values (so nothing is optimised away).
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

const [root, specJson] = process.argv.slice(2);
const { loadData } = await import(pathToFileURL(join(root, 'dist/data/load.js')).href);
const spec = JSON.parse(specJson);
const data = loadData(spec, spec.frequencyHint ?? null, spec.period ?? null);
const values = data.groups[0].series.values;
let sum = 0;
for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i])) sum += values[i];
process.stdout.write(`${data.rows} rows, ${values.length} periods, sum ${sum.toFixed(3)}\n`);
