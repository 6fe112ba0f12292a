/**
 * Sending the .eml over SMTP to a real server (the smtp-server package) started here on 127.0.0.1 with a
 * free port, TLS off. The server, not our code, decides what it received; the test compares that with the
 * file byte for byte.
 */
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { type AddressInfo, createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { chartPng } from '../../src/chart/png.js';
import type { Console } from '../../src/cli/output.js';
import { run } from '../../src/cli/render.js';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import { emailEnvelope, emailImages, renderEmail } from '../../src/render/email.js';
import { renderPdf } from '../../src/render/pdf/index.js';
import { type SmtpSettings, sendEmail, smtpSettings } from '../../src/render/send.js';
import type { Brief } from '../../src/vocabulary/brief.js';

interface Received {
  from: string;
  to: string[];
  bytes: Buffer;
}

let eml: Buffer;
let brief: Brief;
let server: SMTPServer;
let port: number;
const received: Received[] = [];

/** Mailboxes starting "nobody@" do not exist; the only login is right / secret. */
function startServer(): Promise<SMTPServer> {
  const s = new SMTPServer({
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    allowInsecureAuth: true,
    logger: false,
    onAuth(auth, _session, callback) {
      if (auth.username === 'right' && auth.password === 'secret') return callback(null, { user: 'right' });
      return callback(Object.assign(new Error('Invalid username or password'), { responseCode: 535 }));
    },
    onRcptTo(address, _session, callback) {
      if (address.address.startsWith('nobody@'))
        return callback(Object.assign(new Error('No such mailbox'), { responseCode: 550 }));
      return callback();
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
        received.push({ from, to: session.envelope.rcptTo.map((r) => r.address), bytes: Buffer.concat(chunks) });
        callback();
      });
    },
  });
  return new Promise((resolve) => s.listen(0, '127.0.0.1', () => resolve(s)));
}

const settings = (extra: Partial<SmtpSettings> = {}): SmtpSettings => ({
  host: '127.0.0.1',
  port,
  secure: false,
  user: null,
  password: null,
  ignoreTLS: true,
  timeout: 10_000,
  ...extra,
});

/** A port nothing listens on: bound by the OS, then released. */
async function closedPort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', () => resolve()));
  const p = (probe.address() as AddressInfo).port;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  return p;
}

async function failure(run: Promise<unknown>): Promise<BriefError> {
  try {
    await run;
  } catch (e) {
    if (e instanceof BriefError) return e;
    throw e;
  }
  throw new Error('expected the send to fail');
}

beforeAll(async () => {
  const job = loadJob('examples/online-orders/job.yaml');
  const [unit] = await buildBriefs(job, { toolVersion: '0.1.0', charts: true, epoch: 1_767_225_600 });
  brief = unit.brief as Brief;
  eml = await renderEmail(brief, {
    pdf: await renderPdf(brief, { archival: true }),
    pdfName: 'online-orders.pdf',
    pngs: emailImages(brief, chartPng),
    email: job.brief.email,
  });
  server = await startServer();
  port = (server.server.address() as AddressInfo).port;
});

afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

describe('sendEmail over loopback SMTP', () => {
  test('the server receives exactly the bytes of the file, for the envelope given', async () => {
    received.length = 0;
    const envelope = emailEnvelope({
      subject: null,
      from: 'insights@lakeside.example',
      to: ['a@x.example'],
      cc: ['b@x.example'],
    });
    const result = await sendEmail(eml, envelope, settings());
    expect(result.accepted).toEqual(['a@x.example', 'b@x.example']);
    expect(received.length).toBe(1);
    expect(received[0].from).toBe('insights@lakeside.example');
    expect(received[0].to).toEqual(['a@x.example', 'b@x.example']);
    expect(received[0].bytes.length).toBe(eml.length);
    expect(received[0].bytes.equals(eml)).toBe(true);
  });

  test('a login the server accepts goes through; a wrong password is one line naming the setting', async () => {
    received.length = 0;
    await sendEmail(
      eml,
      { from: 'me@x.example', to: ['a@x.example'] },
      settings({ user: 'right', password: 'secret' }),
    );
    expect(received.length).toBe(1);
    const e = await failure(
      sendEmail(eml, { from: 'me@x.example', to: ['a@x.example'] }, settings({ user: 'right', password: 'wrong' })),
    );
    expect(e.exitCode).toBe(1);
    expect(e.oneLine()).not.toContain('\n');
    expect(e.oneLine()).toMatch(/refused the login.*TRENDBRIEF_SMTP_PASSWORD/);
  });

  test('a recipient the server rejects is reported by address', async () => {
    const e = await failure(sendEmail(eml, { from: 'me@x.example', to: ['nobody@x.example'] }, settings()));
    expect(e.exitCode).toBe(1);
    expect(e.oneLine()).not.toContain('\n');
    expect(e.oneLine()).toContain('nobody@x.example');
    // Partly rejected: the others get the message, but the run still fails, naming the one refused.
    received.length = 0;
    const partial = await failure(
      sendEmail(eml, { from: 'me@x.example', to: ['a@x.example', 'nobody@y.example'] }, settings()),
    );
    expect(received.map((r) => r.to)).toEqual([['a@x.example']]);
    expect(partial.oneLine()).toContain('nobody@y.example');
    expect(partial.exitCode).toBe(1);
  });

  test('a refused connection is one line with a hint and exit code 1', async () => {
    const p = await closedPort();
    const e = await failure(sendEmail(eml, { from: 'me@x.example', to: ['a@x.example'] }, settings({ port: p })));
    expect(e.oneLine()).toBe(
      `cannot send the email: the connection to 127.0.0.1:${p} was refused — check TRENDBRIEF_SMTP_HOST and TRENDBRIEF_SMTP_PORT, and that the server is running`,
    );
    expect(e.exitCode).toBe(1);
  });

  test('no sender or no recipient is refused before connecting', async () => {
    const unused = await closedPort();
    const noFrom = await failure(sendEmail(eml, { from: null, to: ['a@x.example'] }, settings({ port: unused })));
    expect(noFrom.oneLine()).toMatch(/no sender — set brief\.email\.from/);
    const noTo = await failure(sendEmail(eml, { from: 'me@x.example', to: [] }, settings({ port: unused })));
    expect(noTo.oneLine()).toMatch(/no recipient — .*--to/);
  });
});

function setEnv(env: Record<string, string | undefined>): void {
  for (const [k, v] of Object.entries(env)) {
    if (v === undefined) delete process.env[k];
    else process.env[k] = v;
  }
}

describe('trendbrief render --send', () => {
  const con = () => {
    const lines: string[] = [];
    const c: Console = {
      verbosity: 'normal',
      debug: false,
      colour: false,
      out: (t) => lines.push(t),
      info: (t) => lines.push(t),
      detail: () => {},
      error: (t) => lines.push(t),
    };
    return { c, lines };
  };
  const withEnv = async <T>(env: Record<string, string | undefined>, fn: () => Promise<T>): Promise<T> => {
    const saved = Object.fromEntries(Object.keys(env).map((k) => [k, process.env[k]]));
    setEnv(env);
    try {
      return await fn();
    } finally {
      setEnv(saved);
    }
  };

  test('writes the .eml (added to the formats), then the server receives that file with --to and --subject', async () => {
    received.length = 0;
    const out = mkdtempSync(join(tmpdir(), 'tb-send-'));
    const { c, lines } = con();
    const args = [
      'examples/online-orders/job.yaml',
      '--out',
      out,
      '--format',
      'json',
      '--send',
      '--to',
      'x@y.example, z@y.example',
      '--subject',
      'Orders, by hand',
    ];
    const code = await withEnv(
      {
        TRENDBRIEF_SMTP_HOST: '127.0.0.1',
        TRENDBRIEF_SMTP_PORT: String(port),
        TRENDBRIEF_SMTP_SECURE: undefined,
        TRENDBRIEF_SMTP_USER: undefined,
      },
      () => run(args, c),
    );
    expect(code, lines.join('\n')).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['online-orders.eml', 'online-orders.json']);
    const file = readFileSync(join(out, 'online-orders.eml'));
    expect(received.length).toBe(1);
    expect(received[0].bytes.equals(file)).toBe(true);
    expect(received[0].to).toEqual(['x@y.example', 'z@y.example']);
    const parsed = await simpleParser(file);
    expect(parsed.subject).toBe('Orders, by hand');
    expect(
      parsed.attachments.some(
        (a) => a.contentType === 'application/pdf' && a.content.subarray(0, 5).toString() === '%PDF-',
      ),
    ).toBe(true);
    expect(lines).toContain(`sent ${join(out, 'online-orders.eml')} to x@y.example, z@y.example`);
  });

  test('with no SMTP host it stops before writing anything, in one line with exit code 1', async () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-send-'));
    const { c } = con();
    const e = await withEnv({ TRENDBRIEF_SMTP_HOST: undefined }, () =>
      failure(run(['examples/online-orders/job.yaml', '--out', out, '--send'], c)),
    );
    expect(e.exitCode).toBe(1);
    expect(e.oneLine()).toMatch(/^cannot send the email: TRENDBRIEF_SMTP_HOST is not set — /);
    expect(readdirSync(out)).toEqual([]);
  });
});

describe('smtpSettings from the environment', () => {
  test('the host is required', () => {
    const e = (() => {
      try {
        smtpSettings({});
      } catch (x) {
        return x as BriefError;
      }
    })();
    expect(e).toBeInstanceOf(BriefError);
    expect(e?.exitCode).toBe(1);
    expect(e?.oneLine()).toMatch(/TRENDBRIEF_SMTP_HOST is not set — set TRENDBRIEF_SMTP_HOST/);
  });

  test('ports default to 587 for STARTTLS and 465 for TLS', () => {
    // Common practice: RFC 6409 §3.1 (submission on 587) and RFC 8314 §3.3 (implicit TLS on 465).
    expect(smtpSettings({ TRENDBRIEF_SMTP_HOST: 'mail.example' })).toMatchObject({
      host: 'mail.example',
      port: 587,
      secure: false,
      user: null,
    });
    expect(smtpSettings({ TRENDBRIEF_SMTP_HOST: 'mail.example', TRENDBRIEF_SMTP_SECURE: '1' })).toMatchObject({
      port: 465,
      secure: true,
    });
    expect(
      smtpSettings({
        TRENDBRIEF_SMTP_HOST: 'mail.example',
        TRENDBRIEF_SMTP_PORT: '2525',
        TRENDBRIEF_SMTP_USER: 'u',
        TRENDBRIEF_SMTP_PASSWORD: 'p',
      }),
    ).toMatchObject({ port: 2525, user: 'u', password: 'p' });
  });

  test('an unreadable port or TLS switch is named', () => {
    expect(() => smtpSettings({ TRENDBRIEF_SMTP_HOST: 'h', TRENDBRIEF_SMTP_PORT: '70000' })).toThrow(
      /TRENDBRIEF_SMTP_PORT is "70000"/,
    );
    expect(() => smtpSettings({ TRENDBRIEF_SMTP_HOST: 'h', TRENDBRIEF_SMTP_SECURE: 'yes' })).toThrow(
      /TRENDBRIEF_SMTP_SECURE is "yes"/,
    );
  });
});
