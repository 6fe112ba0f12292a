/**
 * `node bench/pdf-render.js [ROOT] [REPS]`: builds bench/brief-12.yaml once with ROOT's dist/ (default this
 * checkout; `npm run build` first), then draws its PDF REPS times (default 5) in the same process and prints
 * one JSON line: the CPU time of each draw in ms (the first is cold: nothing of the PDF engine has run yet),
 * the file's size and the start of its SHA-256. CPU time rather than wall time, as other work on a shared
 * machine moves wall time far more. To compare two builds, run this on each in alternation (bench/PDF.md).
 *
 * After the full draws, the back matter's share: the same brief's document cut to its masthead alone
 * ("head") and to its masthead and back matter (cautions, method and data appendices: "back"), each drawn
 * and written REPS times, in alternation, warm. `backMs` is the median of back minus the median of head:
 * drawing the back matter's tables and writing them into the file (serialisation included, since the file
 * is written as the document ends), without what every PDF pays (fonts, metadata, the masthead).
 */
import { createHash } from 'node:crypto';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = join(dirname(fileURLToPath(import.meta.url)), '..');
const root = resolve(process.argv[2] ?? here);
const reps = Number(process.argv[3] ?? 5);
const load = (path) => import(pathToFileURL(join(root, 'dist', path)).href);

const { buildBriefs } = await load('brief/build.js');
const { loadJob } = await load('job/load.js');
const { renderPdf, startPdf } = await load('render/pdf/index.js');
const { buildDocument } = await load('document/build.js');
const { briefView } = await load('document/view.js');
const units = await buildBriefs(loadJob(join(here, 'bench/brief-12.yaml')), {
  toolVersion: 'bench',
  charts: true,
  epoch: 1_700_000_000,
});
const brief = units[0].brief;
const cpuTime = async (draw) => {
  const start = process.cpuUsage();
  const pdf = await draw();
  const used = process.cpuUsage(start);
  return { ms: (used.user + used.system) / 1000, pdf };
};
const cpu = [];
let pdf = Buffer.alloc(0);
for (let i = 0; i < reps; i++) {
  const run = await cpuTime(() => renderPdf(brief));
  cpu.push(Math.round(run.ms));
  pdf = run.pdf;
}

const view = briefView(brief);
const document = buildDocument(brief, view);
const cut = (names) => ({ ...document, sections: document.sections.filter((s) => names(s.name)) });
const head = cut((n) => n === 'masthead');
const back = cut((n) => n === 'masthead' || n === 'cautions' || n.startsWith('appendix'));
const drawCut = (doc) => startPdf(view).finish(view, doc);
const times = { head: [], back: [] };
for (let i = 0; i < reps; i++) {
  times.head.push((await cpuTime(() => drawCut(head))).ms);
  times.back.push((await cpuTime(() => drawCut(back))).ms);
}
const median = (a) => {
  const s = [...a].sort((x, y) => x - y);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const sha = createHash('sha256').update(pdf).digest('hex').slice(0, 12);
console.log(
  JSON.stringify({
    root,
    cpuMs: cpu,
    headMs: Math.round(median(times.head)),
    backMs: Math.round(median(times.back) - median(times.head)),
    bytes: pdf.length,
    sha256: sha,
  }),
);
