/**
 * The PDF's own thread (thread.ts): draws the brief as its views arrive on `port` and sends the file back.
 * Its entry is pdf-worker.ts when the command line runs from its modules, or the one-script build's
 * `threadMain` (cli/main.ts) when it runs from dist/bundle/main.cjs with its code cache.
 */
import type { MessagePort } from 'node:worker_threads';
import { BriefError, errorForThread } from '../../errors.js';
import { type PdfDrawing, startPdf } from './index.js';
import type { PdfReply, PdfRequest } from './thread.js';

export function servePdf(port: MessagePort): void {
  let drawing: PdfDrawing | null = null;
  const send = (m: PdfReply, transfer: ArrayBuffer[] = []) => port.postMessage(m, transfer);

  async function finish(...args: Parameters<PdfDrawing['finish']>): Promise<void> {
    try {
      if (!drawing) throw new Error('the PDF thread was asked to finish before it was started');
      const bytes = await drawing.finish(...args);
      // Handed over without a copy when the bytes fill their buffer (else they share it with others: copied).
      const whole = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength;
      const own = whole ? new Uint8Array(bytes.buffer) : Uint8Array.from(bytes);
      send({ bytes: own }, [own.buffer as ArrayBuffer]);
    } catch (e) {
      const b =
        e instanceof BriefError
          ? e
          : new BriefError('pdf-failed', `the PDF brief could not be drawn: ${String(e)}`, '', {}, 1);
      send({ error: errorForThread(b) });
    }
    port.close();
  }

  port.on('message', (m: PdfRequest) => {
    if (m.kind === 'start') drawing = startPdf(m.head, { archival: m.archival });
    else if (m.kind === 'series') drawing?.series(m.view);
    else void finish(m.view, m.document);
  });
}
