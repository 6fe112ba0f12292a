/**
 * renderBriefFiles draws the built-in PDF while the brief is built (each series as it is finished, here one
 * after another, as in a batch worker): the file is the same bytes as renderPdf drawing the finished brief.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { renderBriefFiles } from '../../src/cli/render-files.js';
import { loadJob } from '../../src/job/load.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import { bytesOf } from '../../src/render/write.js';
import { ROOT } from './run.js';

describe('the PDF drawn while the brief is built', () => {
  it('is the PDF drawn from the finished brief (examples/water-deliveries and bench/brief-12.yaml)', async () => {
    const previous = process.env.SOURCE_DATE_EPOCH;
    process.env.SOURCE_DATE_EPOCH = '1767225600';
    try {
      for (const jobFile of ['examples/water-deliveries/job.yaml', 'bench/brief-12.yaml']) {
        const job = loadJob(join(ROOT, jobFile));
        const options = { formats: ['pdf' as const], period: null, pdfEngine: 'builtin' as const, overrides: {} };
        const out = await renderBriefFiles(job, null, '/nonexistent', options, 'test');
        const [unit] = await buildBriefs(job, { toolVersion: 'test', charts: true });
        if (!unit.brief) throw unit.error;
        const pdf = await renderPdf(unit.brief, { archival: job.brief.pdfArchival });
        expect(out.files.map((f) => f.path.endsWith('.pdf'))).toEqual([true]);
        expect(bytesOf(out.files[0]).equals(pdf), jobFile).toBe(true);
      }
    } finally {
      if (previous === undefined) delete process.env.SOURCE_DATE_EPOCH;
      else process.env.SOURCE_DATE_EPOCH = previous;
    }
  }, 60_000);
});
