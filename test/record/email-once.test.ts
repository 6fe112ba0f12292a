/**
 * Email sent once, through the built command line and a real SMTP server (the smtp-server package) on
 * 127.0.0.1: the record keeps who got each message, so a rerun sends only to those who did not, and a
 * third run sends nothing. The server, not our code, says who received what.
 */
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_COPY } from '../cli/run.js';
import { ROOT, runCliAsync } from './cli-async.js';

let server: SMTPServer;
let port: number;
/** Mailboxes refused for good while this is true. */
let refuseLate = true;
const received: string[][] = [];

beforeAll(async () => {
  server = new SMTPServer({
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onRcptTo(address, _session, callback) {
      if (refuseLate && address.address.startsWith('late@'))
        return callback(Object.assign(new Error('Mailbox unavailable'), { responseCode: 550 }));
      return callback();
    },
    onData(stream, session, callback) {
      stream.resume();
      stream.on('end', () => {
        received.push(session.envelope.rcptTo.map((r) => r.address));
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  port = (server.server.address() as AddressInfo).port;
});

afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

describe('email sent once', () => {
  const dir = mkdtempSync(join(tmpdir(), 'tb-email-once-'));
  cpSync(join(ROOT, 'examples', 'water-deliveries'), dir, EXAMPLE_COPY);
  const job = join(dir, 'job.yaml');
  writeFileSync(
    job,
    readFileSync(job, 'utf8').replace(
      'outputs: [html, pdf]',
      'outputs: [eml]\n  email: { from: analytics@riverside.example, to: [ops@riverside.example, late@riverside.example], cc: [board@riverside.example] }',
    ),
  );
  const send = () =>
    runCliAsync(['render', job, '--out', join(dir, 'out'), '--send', '--period', '2026-09'], {
      TRENDBRIEF_SMTP_HOST: '127.0.0.1',
      TRENDBRIEF_SMTP_PORT: String(port),
      TRENDBRIEF_RECORD: 'auto',
      SOURCE_DATE_EPOCH: '1790000000',
    });

  it('records who got the message and who did not', async () => {
    const r = await send();
    expect(r.code).toBe(1);
    expect(received).toEqual([['ops@riverside.example', 'board@riverside.example']]);
    expect(r.stderr).toMatch(/late@riverside\.example/);
  });

  it('sends a rerun only to the recipient still without it', async () => {
    refuseLate = false;
    const r = await send();
    expect(r.code, r.stderr).toBe(0);
    expect(received.slice(1)).toEqual([['late@riverside.example']]);
  });

  it('sends nothing when everyone has it', async () => {
    const r = await send();
    expect(r.code, r.stderr).toBe(0);
    expect(received.length).toBe(2);
    expect(r.stderr).toMatch(/already sent to all 3 recipients/);
  });
});
