/**
 * Sending when the server is unhelpful, against real servers on 127.0.0.1: smtp-server for servers that
 * follow the protocol (and refuse, for good or for now), and a bare TCP server that dribbles out a reply
 * that never ends. Reply codes and their meaning: RFC 5321 §4.2 (2xx done, 4xx try again later, 5xx
 * never), 530 "authentication required" from RFC 4954 §6.
 */
import { cpSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { type AddressInfo, createServer, type Server, type Socket } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SMTPServer, type SMTPServerOptions } from 'smtp-server';
import { afterEach, describe, expect, test } from 'vitest';
import type { Console } from '../../src/cli/output.js';
import { run } from '../../src/cli/render.js';
import { BriefError } from '../../src/errors.js';
import { deliverEmail, type SmtpSettings, sendEmail } from '../../src/render/send.js';

const EML = Buffer.from(
  'From: me@x.example\r\nTo: a@x.example\r\nSubject: Test\r\nMessage-ID: <abc.123@trendbrief.invalid>\r\n\r\nHello.\r\n',
);

const closers: (() => Promise<void>)[] = [];
afterEach(async () => {
  for (const close of closers.splice(0)) await close();
});

interface Got {
  to: string[];
}

/** An SMTP server on a free loopback port with the given hooks; what it accepted lands in `got`. */
async function smtp(options: Partial<SMTPServerOptions>): Promise<{ port: number; got: Got[] }> {
  const got: Got[] = [];
  const server = new SMTPServer({
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, callback) {
      stream.resume();
      stream.on('end', () => {
        got.push({ to: session.envelope.rcptTo.map((r) => r.address) });
        callback();
      });
    },
    ...options,
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  closers.push(() => new Promise((resolve) => server.close(() => resolve())));
  return { port: (server.server.address() as AddressInfo).port, got };
}

const settings = (port: number, extra: Partial<SmtpSettings> = {}): SmtpSettings => ({
  host: '127.0.0.1',
  port,
  secure: false,
  user: null,
  password: null,
  ignoreTLS: true,
  timeout: 5_000,
  retryDelays: [20, 40],
  ...extra,
});

const refuse = (code: number, text: string) => Object.assign(new Error(text), { responseCode: code });

async function failure(p: Promise<unknown>): Promise<BriefError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof BriefError) return e;
    throw e;
  }
  throw new Error('expected a failure');
}

describe('what each recipient got', () => {
  test('accepted and refused recipients are told apart exactly, with the message id', async () => {
    const { port, got } = await smtp({
      onRcptTo(address, _session, callback) {
        if (address.address.startsWith('nobody')) return callback(refuse(550, 'No such mailbox'));
        callback();
      },
    });
    const d = await deliverEmail(
      EML,
      { from: 'me@x.example', to: ['a@x.example', 'nobody@x.example', 'b@x.example'] },
      settings(port),
    );
    expect(d.messageId).toBe('<abc.123@trendbrief.invalid>');
    expect(d.accepted).toEqual(['a@x.example', 'b@x.example']);
    expect(d.refused).toEqual([{ address: 'nobody@x.example', code: 550, reply: '550 No such mailbox' }]);
    expect(d.attempts).toBe(1);
    expect(d.failure).toBeNull();
    expect(got).toEqual([{ to: ['a@x.example', 'b@x.example'] }]);
  });

  test('a temporary refusal (451) is tried again, for the recipients still waiting only', async () => {
    let tries = 0;
    const { port, got } = await smtp({
      onRcptTo(address, _session, callback) {
        if (address.address === 'later@x.example' && tries++ === 0) return callback(refuse(451, 'Try again later'));
        callback();
      },
    });
    const d = await deliverEmail(EML, { from: 'me@x.example', to: ['a@x.example', 'later@x.example'] }, settings(port));
    expect(d.accepted).toEqual(['a@x.example', 'later@x.example']);
    expect(d.refused).toEqual([]);
    expect(d.attempts).toBe(2);
    // Each recipient got exactly one copy.
    expect(got).toEqual([{ to: ['a@x.example'] }, { to: ['later@x.example'] }]);
  });

  test('a server that turns the connection away for now (421) is tried again', async () => {
    let connections = 0;
    const { port, got } = await smtp({
      onConnect(_session, callback) {
        if (connections++ === 0) return callback(refuse(421, 'Too busy, come back later'));
        callback();
      },
    });
    const d = await deliverEmail(EML, { from: 'me@x.example', to: ['a@x.example'] }, settings(port));
    expect(d.accepted).toEqual(['a@x.example']);
    expect(d.attempts).toBe(2);
    expect(got).toHaveLength(1);
  });

  test('a refusal for now that lasts is reported after the last attempt, as temporary', async () => {
    const { port } = await smtp({
      onRcptTo(_address, _session, callback) {
        callback(refuse(451, 'Greylisted'));
      },
    });
    const s = settings(port);
    const d = await deliverEmail(EML, { from: 'me@x.example', to: ['a@x.example'] }, s);
    expect(d.attempts).toBe(3);
    expect(d.accepted).toEqual([]);
    expect(d.refused).toEqual([{ address: 'a@x.example', code: 451, reply: '451 Greylisted' }]);
    const e = await failure(sendEmail(EML, { from: 'me@x.example', to: ['a@x.example'] }, s));
    expect(e.oneLine()).toMatch(
      /did not take the email for a@x\.example \(451 Greylisted\) — .*refused for now, 3 times/,
    );
  });

  test('530 "authentication required" is reported as a missing login, not as an address', async () => {
    // Once: "refused the envelope … check brief.email.from, to and cc".
    const { port } = await smtp({
      onMailFrom(_address, _session, callback) {
        callback(refuse(530, 'Authentication required'));
      },
    });
    const e = await failure(sendEmail(EML, { from: 'me@x.example', to: ['a@x.example'] }, settings(port)));
    expect(e.code).toBe('smtp-auth-required');
    expect(e.oneLine()).toMatch(/wants a login .*530 Authentication required.* — set TRENDBRIEF_SMTP_USER/);
    expect(e.oneLine()).not.toMatch(/brief\.email|--to/);
  });
});

describe('a server that never finishes its reply', () => {
  /** Greets with "220-" continuation lines, one every 50 ms, and never the last line (RFC 5321 §4.2.1). */
  async function dribbler(): Promise<{ port: number; sockets: Set<Socket> }> {
    const sockets = new Set<Socket>();
    const server: Server = createServer((socket) => {
      sockets.add(socket);
      socket.on('error', () => {});
      const timer = setInterval(() => socket.write('220-still greeting you\r\n'), 50);
      socket.on('close', () => {
        clearInterval(timer);
        sockets.delete(socket);
      });
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
    closers.push(
      () =>
        new Promise((resolve) => {
          for (const s of sockets) s.destroy();
          server.close(() => resolve());
        }),
    );
    return { port: (server.address() as AddressInfo).port, sockets };
  }

  test('is left at the deadline, with the connection closed', async () => {
    // Every line resets the per-reply timeout (5 s here), so only an overall deadline ends this.
    const { port, sockets } = await dribbler();
    const e = await failure(
      sendEmail(EML, { from: 'me@x.example', to: ['a@x.example'] }, settings(port, { deadline: 1_000 })),
    );
    expect(e.code).toBe('smtp-deadline');
    expect(e.oneLine()).toMatch(/had not finished within 1 s — /);
    // Our side of the connection is gone: the server sees it close.
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(sockets.size).toBe(0);
  });
});

describe('render --send when sending fails', () => {
  test('the brief still counts as written, and the summary and exit code say the email was not sent', async () => {
    const { port } = await smtp({
      onRcptTo(_address, _session, callback) {
        callback(refuse(550, 'No such mailbox'));
      },
    });
    const dir = mkdtempSync(join(tmpdir(), 'tb-send-fail-'));
    cpSync('test/bad-input/good', join(dir, 'job'), { recursive: true });
    const job = join(dir, 'job', 'job.yaml');
    writeFileSync(job, readFileSync(job, 'utf8').replace('brief:\n', 'brief:\n  email: { from: me@x.example }\n'));
    const out = join(dir, 'out');
    const lines: string[] = [];
    const con: Console = {
      verbosity: 'normal',
      debug: false,
      colour: false,
      out: (t) => lines.push(t),
      info: (t) => lines.push(t),
      detail: () => {},
      error: (t) => lines.push(t),
    };
    const saved = { host: process.env.TRENDBRIEF_SMTP_HOST, port: process.env.TRENDBRIEF_SMTP_PORT };
    process.env.TRENDBRIEF_SMTP_HOST = '127.0.0.1';
    process.env.TRENDBRIEF_SMTP_PORT = String(port);
    let code: number;
    try {
      code = await run([job, '--out', out, '--format', 'json', '--send', '--to', 'gone@x.example'], con);
    } finally {
      for (const [k, v] of [
        ['TRENDBRIEF_SMTP_HOST', saved.host],
        ['TRENDBRIEF_SMTP_PORT', saved.port],
      ] as const)
        if (v === undefined) delete process.env[k];
        else process.env[k] = v;
    }
    expect(code).toBe(1);
    expect(readdirSync(out).sort()).toEqual(['hardening-sample.eml', 'hardening-sample.json']);
    expect(lines).toContain(`wrote ${join(out, 'hardening-sample.eml')}`);
    expect(
      lines.some((l) => /^not sent: .*hardening-sample\.eml: .*gone@x\.example \(550 No such mailbox\)/.test(l)),
    ).toBe(true);
    expect(lines.some((l) => /^1 brief written, 1 not sent to every recipient, 0 failed, in /.test(l))).toBe(true);
  });
});
