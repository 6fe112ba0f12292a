/**
 * `node bench/refits.js` (after `npm run build`): what the re-fits of the firmness study and the sensitivity
 * search cost, and why robust re-fits are not started from the full fit's weights. On the monthly and
 * quarterly open datasets of the verifier's corpus (test/verify/corpus/corpus.json):
 *
 *   1. The sensitivity search on additive STL without robustness weights: fits per search walking the grid,
 *      binary-searching it, and on the line three fits give (analyse/sensitivity.ts `affine`), and whether
 *      the three give the same value.
 *   2. Robust STL (15 passes, as R's stl): the largest change of any robustness weight at each pass, from
 *      the usual start (all weights 1). Where it has not fallen to nothing by pass 15, the published trend
 *      is that of the fifteenth pass of a process still moving, and a fit started anywhere else (the full
 *      fit's weights) and run to convergence ends somewhere else, or nowhere.
 *
 * Writes bench/REFITS.md with --write. Counts, not times: they do not depend on the machine's load.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const { stl } = await import(join(root, 'dist/decompose/stl.js'));
const { reversalValue } = await import(join(root, 'dist/analyse/sensitivity.js'));
const { robustScale } = await import(join(root, 'dist/diagnose/robust-scale.js'));
const { trendDirection } = await import(join(root, 'dist/analyse/direction.js'));

const corpusDir = join(root, 'test/verify/corpus');
const corpus = JSON.parse(readFileSync(join(corpusDir, 'corpus.json'), 'utf8'));
const PERIOD = { monthly: 12, quarterly: 4 };
const sets = corpus
  .filter((d) => PERIOD[d.frequency] && d.n >= 4 * PERIOD[d.frequency])
  .map((d) => {
    const lines = readFileSync(join(corpusDir, d.file), 'utf8').trim().split('\n').slice(1);
    const y = Float64Array.from(lines.map((l) => (l.split(',')[1] === '' ? Number.NaN : Number(l.split(',')[1]))));
    return { id: d.id, period: PERIOD[d.frequency], y };
  })
  .filter((d) => d.y.every(Number.isFinite));

const lines = [];
const out = (s = '') => {
  lines.push(s);
  console.log(s);
};
out('# Re-fits: what they cost and what the full fit can lend them');
out();
out(`Measured ${new Date().toISOString().slice(0, 10)} by \`node bench/refits.js\` (counts of fits, not times).`);
out();
out('## 1. The sensitivity search on fits linear in the data');
out();
out('Additive STL, seasonal window 13, no robustness weights; the search as the brief runs it (48 grid steps');
out('out to twelve robust spreads of the remainder, from the value the pattern expects next).');
out();
out('| series | walk: fits | binary search: fits | line: fits | same value |');
out('| --- | ---: | ---: | ---: | --- |');
let totals = [0, 0, 0];
for (const d of sets) {
  const n = d.y.length;
  const full = stl(d.y, { period: d.period, seasonalWindow: 13 });
  const { direction } = trendDirection(full.trend, n - 1);
  const misfit = Array.from(d.y, (v, i) => v - full.trend[i] - full.seasonal[i]);
  const spread = robustScale(misfit).mad;
  const expected = full.trend[n - 1] + full.seasonal[n - d.period];
  const extended = new Float64Array(n + 1);
  extended.set(d.y);
  const search = (options) => {
    let fits = 0;
    const r = reversalValue(
      direction,
      expected,
      12 * spread,
      false,
      (x) => {
        fits++;
        extended[n] = x;
        const t = stl(extended, { period: d.period, seasonalWindow: 13 }).trend;
        return t[n] - t[n - 1];
      },
      { steps: 48, ...options },
    );
    return { r, fits };
  };
  const walk = search({});
  const binary = search({ singleCrossing: true });
  const line = search({ singleCrossing: true, affine: true });
  const same =
    Object.is(walk.r.reversalValue, binary.r.reversalValue) && Object.is(walk.r.reversalValue, line.r.reversalValue);
  totals = [totals[0] + walk.fits, totals[1] + binary.fits, totals[2] + line.fits];
  out(
    `| ${d.id} (${direction}) | ${walk.fits} | ${binary.fits} | ${line.fits} | ${same ? 'yes' : `no: ${walk.r.reversalValue} / ${line.r.reversalValue}`} |`,
  );
}
out(`| all | ${totals[0]} | ${totals[1]} | ${totals[2]} | |`);
out();
out('## 2. Robust STL from the usual start: the largest change of a weight at each pass');
out();
out('Pass k is the k-th recomputation of the bisquare weights (R\'s stl stops after 15). "Settled" is the');
out('first pass after which no weight moves by more than 1e-3.');
out();
out('| series | pass 1 | 5 | 10 | 14 | 15 | 20 | 30 | 40 | settled |');
out('| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |');
for (const d of sets) {
  let before = null;
  const moves = [];
  for (let k = 1; k <= 40; k++) {
    const w = stl(d.y, { period: d.period, seasonalWindow: 13, robust: true, outer: k }).weights;
    if (before) {
      let m = 0;
      for (let i = 0; i < w.length; i++) m = Math.max(m, Math.abs(w[i] - before[i]));
      moves.push(m);
    } else moves.push(Math.max(...Array.from(w, (v) => 1 - v)));
    before = w;
  }
  const settled = moves.findIndex((m) => m <= 1e-3);
  const at = (k) => moves[k - 1].toExponential(0);
  out(
    `| ${d.id} | ${at(1)} | ${at(5)} | ${at(10)} | ${at(14)} | ${at(15)} | ${at(20)} | ${at(30)} | ${at(40)} | ${settled < 0 ? 'not by 40' : settled + 1} |`,
  );
}
out();
out('Where the weights still move at pass 15, the fifteenth pass is a point on the way, not a fixed point: a');
out("fit started from the full fit's weights and run until they settle answers a different question (and on");
out('the series that never settle, none). The firmness study asks what the brief would have said at each cut,');
out('which is the usual fit of the data then, so its re-fits start as the usual fit does.');
if (process.argv.includes('--write')) writeFileSync(join(root, 'bench/REFITS.md'), `${lines.join('\n')}\n`);
