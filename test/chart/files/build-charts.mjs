// Run by imports.test.ts: builds the charts of an example brief through the built library (dist/), as the
// brief does, so that the process's module log shows what drawing them loads.
const root = new URL('../../../', import.meta.url);
const { loadJob } = await import(new URL('dist/job/load.js', root).href);
const { buildBriefs } = await import(new URL('dist/brief/build.js', root).href);
const job = loadJob(new URL('examples/water-deliveries/job.yaml', root).pathname);
const units = await buildBriefs(job, { toolVersion: 'test', charts: true });
const charts = units.flatMap((u) => u.brief?.series.flatMap((s) => s.charts) ?? []);
process.stdout.write(`${charts.length} charts\n`);
