/**
 * The built-in PDF drawn on a thread of its own (pdf-worker.ts) while this one builds the brief. The
 * drawing is the same as startPdf's (index.ts) — the same views in the same order give the same bytes —
 * but the PDF engine loads, the masthead is drawn and each series that can be drawn as it comes (one series,
 * or a layout without the overview first) is drawn on the other core, and the rest of the document is drawn
 * there while this thread writes the HTML brief. Only the views cross over (structured clones; the file's
 * bytes come back transferred).
 *
 * A failure of the drawing is the same `pdf-failed` error as on this thread. A thread that cannot start or
 * dies leaves `finish` with null, and the caller draws the PDF itself from the finished brief.
 */
import { availableParallelism } from 'node:os';
import { isMainThread, Worker } from 'node:worker_threads';
import type { BriefDocument } from '../../document/blocks.js';
import type { BriefView, HeadView, SeriesView } from '../../document/view.js';
import { BriefError, errorFromThread, type ThreadError } from '../../errors.js';
import { threadEntry } from '../../thread-entry.js';

/** The worker's entry module (absent when the code runs from its TypeScript sources, as under vitest). */
export const PDF_WORKER = new URL('./pdf-worker.js', import.meta.url);

/** What the thread is sent, in this order: one start, a series message per series, one finish. */
export type PdfRequest =
  | { kind: 'start'; head: HeadView; archival: boolean }
  | { kind: 'series'; view: SeriesView }
  | { kind: 'finish'; view: BriefView; document: BriefDocument };

/** What the thread sends back, once: the file, or why it could not be drawn. */
export type PdfReply = { bytes: Uint8Array } | { error: ThreadError };

/** startPdf's drawing on the other thread; `finish` gives null when the thread was lost. */
export interface ThreadDrawing {
  series(view: SeriesView): void;
  finish(view: BriefView, document: BriefDocument): Promise<Buffer | null>;
  /** Ends the thread of a brief that will not be finished (its build failed). */
  abandon(): void;
}

/**
 * Whether the PDF gets a thread of its own: TRENDBRIEF_PDF_THREAD=0 or 1 when set, else on a machine of
 * four or more cores; only from the main thread (a batch's workers fill every core already) and only where
 * the built worker file is. On the 2-core benchmark machine it took a fifth to a quarter of the main
 * thread's CPU time for 2–10% more CPU in all, and no wall time was won under load (bench/PDF.md): V8's
 * compiler threads already use the second core.
 */
export function canDrawOnThread(): boolean {
  const v = process.env.TRENDBRIEF_PDF_THREAD;
  if (v !== undefined && v !== '' && v !== '0' && v !== '1') {
    throw new BriefError(
      'bad-pdf-thread',
      `TRENDBRIEF_PDF_THREAD is "${v}", not 0 or 1`,
      'set it to 0 (draw the PDF on the main thread) or 1 (on a thread of its own), or unset it',
    );
  }
  const wanted = v === '1' || ((v === undefined || v === '') && availableParallelism() >= 4);
  return wanted && isMainThread && threadEntry('pdf', PDF_WORKER) !== null;
}

/** Starts the thread and sends it the head; null when no thread could be started. */
export function startPdfThread(head: HeadView, archival: boolean): ThreadDrawing | null {
  const entry = threadEntry('pdf', PDF_WORKER);
  if (!entry) return null;
  let worker: Worker;
  try {
    worker = new Worker(entry);
  } catch {
    return null;
  }
  let lost = false;
  const reply = new Promise<PdfReply | null>((resolve) => {
    worker.once('message', (m: PdfReply) => resolve(m));
    // An error the drawing did not catch, or a thread that ends without a reply: the caller draws it.
    worker.once('error', () => resolve(null));
    worker.once('exit', () => resolve(null));
  }).then((m) => {
    if (m === null) lost = true;
    void worker.terminate();
    return m;
  });
  // Until finish, the thread must not keep a run that fails before it alive.
  worker.unref();
  const send = (m: PdfRequest): void => {
    if (lost) return;
    try {
      worker.postMessage(m);
    } catch {
      // A view that cannot be cloned: the thread is given up, and the caller draws the PDF.
      lost = true;
      void worker.terminate();
    }
  };
  send({ kind: 'start', head, archival });
  return {
    series: (view) => send({ kind: 'series', view }),
    finish: async (view, document) => {
      worker.ref();
      send({ kind: 'finish', view, document });
      const m = await reply;
      if (m === null || lost) return null;
      if ('bytes' in m) return Buffer.from(m.bytes.buffer, m.bytes.byteOffset, m.bytes.byteLength);
      throw errorFromThread(m.error);
    },
    abandon: () => {
      lost = true;
      void worker.terminate();
    },
  };
}
