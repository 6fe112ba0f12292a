/**
 * Sends a finished .eml over SMTP (RFC 5321) with nodemailer's SMTP connection, byte for byte as written:
 * the message is handed over raw, so what arrives is the file on disk. Each recipient's fate is known
 * (deliverEmail): accepted, refused for good (5xx), or refused for now (4xx, RFC 5321 §4.2.1), which is
 * tried again after a pause — twice, after 2 and 8 seconds — for the recipients still waiting only. The
 * whole delivery of one message has a deadline (two minutes), so a server that never finishes a reply
 * (a multi-line reply dribbled out for ever resets every per-reply timeout) cannot hold a run. The server and its credentials come from the
 * environment only, never from the job file, so a job can be shared without leaking a password:
 *
 *   TRENDBRIEF_SMTP_HOST      server name (required)
 *   TRENDBRIEF_SMTP_PORT      port (default 465 with TLS, else 587)
 *   TRENDBRIEF_SMTP_SECURE=1  TLS from the first byte; otherwise STARTTLS when the server offers it
 *   TRENDBRIEF_SMTP_USER      user name, when the server wants one
 *   TRENDBRIEF_SMTP_PASSWORD  its password
 *
 * Every failure becomes one BriefError line with a hint and exit code 1.
 */
import SMTPConnection from 'nodemailer/lib/smtp-connection';
import { BriefError } from '../errors.js';

export interface SmtpSettings {
  host: string;
  port: number;
  /** TLS from the start (SMTPS); false means plain, upgraded with STARTTLS when offered. */
  secure: boolean;
  user: string | null;
  password: string | null;
  /** Skip STARTTLS even when offered. Never set from the environment: only for a loopback test server. */
  ignoreTLS?: boolean;
  /** Milliseconds to wait for the connection and each reply (default 20 s). */
  timeout?: number;
  /** Milliseconds the whole delivery of one message may take, retries included (default 2 minutes). */
  deadline?: number;
  /** Pauses before each further attempt after a temporary refusal (default 2 s, then 8 s). */
  retryDelays?: number[];
}

export interface Envelope {
  from: string | null;
  to: string[];
}

export interface SendResult {
  accepted: string[];
  response: string;
}

/** A recipient that did not get the message, and the server's reply (or what failed) saying why. */
export interface Refusal {
  address: string;
  /** The reply code (550, 451, …); null when no reply was given (the connection failed). */
  code: number | null;
  reply: string;
}

/**
 * What became of one message: exactly which recipients the server accepted and which it did not. This is
 * what a record of sent mail keeps, so that a rerun sends only to those still without it.
 */
export interface Delivery {
  /** The Message-ID header of the message, as written in the .eml (null if it has none). */
  messageId: string | null;
  accepted: string[];
  refused: Refusal[];
  /** Connections made (1 when no temporary refusal was retried). */
  attempts: number;
  /** The last server reply to the message itself, when someone got it. */
  response: string;
  /** Why the message failed as a whole (nobody got it, or the run stopped), or null. */
  failure: BriefError | null;
}

const HINT_ENV =
  'set TRENDBRIEF_SMTP_HOST (and TRENDBRIEF_SMTP_PORT, TRENDBRIEF_SMTP_SECURE=1 for TLS) in the environment';

/** The SMTP settings from the environment; a missing host or an unreadable port is an error. */
export function smtpSettings(env: NodeJS.ProcessEnv = process.env): SmtpSettings {
  const host = (env.TRENDBRIEF_SMTP_HOST ?? '').trim();
  if (host === '') throw sendError('smtp-no-host', 'cannot send the email: TRENDBRIEF_SMTP_HOST is not set', HINT_ENV);
  const secureText = (env.TRENDBRIEF_SMTP_SECURE ?? '').trim();
  if (!['', '0', '1'].includes(secureText)) {
    throw sendError(
      'smtp-bad-secure',
      `TRENDBRIEF_SMTP_SECURE is "${secureText}", not 1 or 0`,
      'set TRENDBRIEF_SMTP_SECURE=1 for TLS from the start, or leave it unset for STARTTLS',
    );
  }
  const secure = secureText === '1';
  const portText = (env.TRENDBRIEF_SMTP_PORT ?? '').trim();
  const port = portText === '' ? (secure ? 465 : 587) : Number(portText);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    throw sendError(
      'smtp-bad-port',
      `TRENDBRIEF_SMTP_PORT is "${portText}", not a port number`,
      'set it to a whole number from 1 to 65535, e.g. 587',
    );
  }
  const user = env.TRENDBRIEF_SMTP_USER?.trim() || null;
  const password = env.TRENDBRIEF_SMTP_PASSWORD ?? null;
  return { host, port, secure, user, password };
}

/**
 * Sends the message as is to every envelope recipient; resolves once the server has accepted it for all.
 * Throws one BriefError when anyone is left without it (deliverEmail says exactly who).
 */
export async function sendEmail(eml: Buffer, envelope: Envelope, settings: SmtpSettings): Promise<SendResult> {
  const d = await deliverEmail(eml, envelope, settings);
  const problem = deliveryProblem(d, settings);
  if (problem) throw problem;
  return { accepted: d.accepted, response: d.response };
}

/** One line for a delivery that left anyone without the message, or null when everyone got it. */
export function deliveryProblem(d: Delivery, settings: SmtpSettings): BriefError | null {
  if (d.failure && d.accepted.length === 0) return d.failure;
  if (d.refused.length === 0) return null;
  const where = `${settings.host}:${settings.port}`;
  const list = d.refused.map((r) => `${r.address} (${oneLine(r.reply)})`).join(', ');
  const others = d.accepted.length > 0 ? `; ${d.accepted.join(', ')} got it` : '';
  const temporary = d.refused.every((r) => r.code !== null && r.code >= 400 && r.code < 500);
  return sendError(
    'smtp-rejected',
    `the SMTP server at ${where} did not take the email for ${list}${others}`,
    temporary
      ? `the server refused for now, ${d.attempts} times: run again later`
      : 'check the addresses in brief.email.to and cc, or --to',
  );
}

/**
 * Sends the message and reports what became of each recipient; never throws for the server's answers, only
 * for a message that cannot be sent at all (no sender, no recipient).
 */
export async function deliverEmail(eml: Buffer, envelope: Envelope, settings: SmtpSettings): Promise<Delivery> {
  const { from, to } = checkEnvelope(envelope);
  const deadline = Date.now() + (settings.deadline ?? 120_000);
  const delays = settings.retryDelays ?? [2_000, 8_000];
  const where = `${settings.host}:${settings.port}`;
  const delivery: Delivery = {
    messageId: messageIdOf(eml),
    accepted: [],
    refused: [],
    attempts: 0,
    response: '',
    failure: null,
  };
  let pending = [...to];
  let waiting: Refusal[] = [];
  while (pending.length > 0) {
    delivery.attempts++;
    let info: SMTPConnection.SentMessageInfo;
    try {
      info = await transaction(eml, from, pending, settings, deadline);
      delivery.failure = null;
    } catch (e) {
      const failure = e as SmtpFailure;
      const rejected = failure.code === 'EENVELOPE' && failure.rejectedErrors?.length ? failure : null;
      if (!rejected) {
        delivery.failure = e instanceof BriefError ? e : explain(failure, where);
        waiting = pending.map((address) => ({
          address,
          code: failure.responseCode ?? null,
          reply: delivery.failure?.message ?? '',
        }));
        if (e instanceof BriefError || !isTemporary(failure.responseCode) || !retry(delivery, delays, deadline)) break;
        await pause(delays[delivery.attempts - 1]);
        continue;
      }
      info = {
        accepted: [],
        rejected: failure.rejected ?? [],
        rejectedErrors: failure.rejectedErrors,
        response: '',
      } as unknown as SMTPConnection.SentMessageInfo;
    }
    delivery.accepted.push(...info.accepted.map(String));
    if (info.accepted.length > 0) delivery.response = oneLine(String(info.response ?? ''));
    waiting = [];
    for (const r of (info.rejectedErrors ?? []) as SmtpFailure[]) {
      const refusal = {
        address: String(r.recipient),
        code: r.responseCode ?? null,
        reply: oneLine(r.response ?? r.message),
      };
      if (isTemporary(refusal.code)) waiting.push(refusal);
      else delivery.refused.push(refusal);
    }
    pending = waiting.map((r) => r.address);
    if (pending.length === 0 || !retry(delivery, delays, deadline)) break;
    await pause(delays[delivery.attempts - 1]);
  }
  delivery.refused.push(...waiting);
  return delivery;
}

/** Whether one more attempt fits: a pause left to take, and time before the deadline after it. */
function retry(d: Delivery, delays: number[], deadline: number): boolean {
  const wait = delays[d.attempts - 1];
  return wait !== undefined && Date.now() + wait < deadline;
}

function pause(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** 4xx: a transient negative completion reply (RFC 5321 §4.2.1), worth trying again later. */
function isTemporary(code: number | null | undefined): boolean {
  return typeof code === 'number' && code >= 400 && code < 500;
}

function messageIdOf(eml: Buffer): string | null {
  const head = eml.subarray(0, Math.max(0, eml.indexOf('\r\n\r\n'))).toString('latin1');
  const m = /^Message-ID:[ \t]*(<[^>\r\n]*>)/im.exec(head);
  return m ? m[1] : null;
}

/**
 * One SMTP transaction on a connection of its own: connect, log in if asked, MAIL, RCPT for each address,
 * DATA. Ends by the deadline whatever the server does: the socket is then destroyed.
 */
function transaction(
  eml: Buffer,
  from: string,
  to: string[],
  settings: SmtpSettings,
  deadline: number,
): Promise<SMTPConnection.SentMessageInfo> {
  const timeout = settings.timeout ?? 20_000;
  const conn = new SMTPConnection({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    // A password never crosses the network in the clear: with credentials and no TLS, STARTTLS is required.
    requireTLS: settings.user !== null && !settings.secure && !settings.ignoreTLS,
    ignoreTLS: settings.ignoreTLS ?? false,
    connectionTimeout: timeout,
    greetingTimeout: timeout,
    socketTimeout: timeout,
    // close() destroys the socket at once rather than waiting for a server that may never close its side.
    socketCloseTimeout: 0,
  });
  return new Promise((resolve, reject) => {
    let settled = false;
    const end = (error: unknown, info?: SMTPConnection.SentMessageInfo): void => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      conn.close();
      if (error) reject(error);
      else resolve(info as SMTPConnection.SentMessageInfo);
    };
    const seconds = Math.round((settings.deadline ?? 120_000) / 1000);
    const timer = setTimeout(
      () =>
        end(
          sendError(
            'smtp-deadline',
            `cannot send the email: the SMTP server at ${settings.host}:${settings.port} had not finished within ${seconds} s`,
            'the server is too slow or misbehaving; try again later or use another server',
          ),
        ),
      Math.max(0, deadline - Date.now()),
    );
    conn.on('error', (e) => end(e));
    conn.on('end', () => end(Object.assign(new Error('the server closed the connection'), { code: 'ECONNECTION' })));
    conn.connect((connectError) => {
      if (connectError) return end(connectError);
      const send = (): void =>
        conn.send({ from, to }, eml, (e, info) => {
          if (e) return end(e);
          // The message is accepted; QUIT is a courtesy the deadline does not wait for.
          settled = true;
          clearTimeout(timer);
          resolve(info as SMTPConnection.SentMessageInfo);
          conn.quit();
          setTimeout(() => conn.close(), 1_000).unref();
        });
      if (settings.user === null) return send();
      conn.login({ credentials: { user: settings.user, pass: settings.password ?? '' } }, (e) => (e ? end(e) : send()));
    });
  });
}

/** A message needs a sender and a recipient to be sent (it is still a valid draft without them). */
export function checkEnvelope(envelope: Envelope): { from: string; to: string[] } {
  if (!envelope.from) {
    throw new BriefError(
      'email-no-sender',
      'cannot send the email: it has no sender',
      'set brief.email.from in the job file',
      {},
      2,
    );
  }
  if (envelope.to.length === 0) {
    throw new BriefError(
      'email-no-recipient',
      'cannot send the email: it has no recipient',
      'set brief.email.to in the job file, or pass --to a@example.org',
      {},
      2,
    );
  }
  return { from: envelope.from, to: envelope.to };
}

interface SmtpFailure extends Error {
  code?: string;
  response?: string;
  responseCode?: number;
  rejected?: string[];
  rejectedErrors?: SmtpFailure[];
  recipient?: string;
  command?: string;
}

/** One line for each way sending fails, with what to try next. */
function explain(e: SmtpFailure, where: string): BriefError {
  const said = e.response ? ` (server said: ${oneLine(e.response)})` : '';
  const text = oneLine(e.message ?? String(e));
  // 530: authentication required (RFC 4954 §6), whichever command it answers — not a problem of addresses.
  if (e.responseCode === 530 || /^530[ -]/.test(e.response ?? '')) {
    return sendError(
      'smtp-auth-required',
      `cannot send the email: the SMTP server at ${where} wants a login${said}`,
      'set TRENDBRIEF_SMTP_USER and TRENDBRIEF_SMTP_PASSWORD',
    );
  }
  switch (e.code) {
    case 'EDNS':
      return sendError(
        'smtp-host-unknown',
        `cannot send the email: the SMTP server name in ${where} was not found`,
        'check TRENDBRIEF_SMTP_HOST',
      );
    case 'ETIMEDOUT':
      return sendError(
        'smtp-timeout',
        `cannot send the email: the SMTP server at ${where} did not answer in time`,
        'check TRENDBRIEF_SMTP_HOST and TRENDBRIEF_SMTP_PORT, and any firewall between',
      );
    case 'EAUTH':
    case 'ENOAUTH':
      return sendError(
        'smtp-auth',
        `cannot send the email: the SMTP server at ${where} refused the login${said}`,
        'check TRENDBRIEF_SMTP_USER and TRENDBRIEF_SMTP_PASSWORD',
      );
    case 'ETLS':
      return sendError(
        'smtp-tls',
        `cannot send the email: TLS with the SMTP server at ${where} failed: ${text}`,
        'set TRENDBRIEF_SMTP_SECURE=1 for port 465, or leave it unset for STARTTLS on port 587',
      );
    case 'EENVELOPE':
      return sendError(
        'smtp-rejected',
        `cannot send the email: the SMTP server at ${where} refused ${e.rejected?.length ? e.rejected.join(', ') : 'the envelope'}${said}`,
        'check brief.email.from, to and cc in the job, or --to',
      );
    case 'EMESSAGE':
      return sendError(
        'smtp-message-refused',
        `cannot send the email: the SMTP server at ${where} refused the message${said}`,
        'the server may limit the size; try without some charts or ask its administrator',
      );
    default: {
      if (/ECONNREFUSED/.test(text)) {
        return sendError(
          'smtp-refused',
          `cannot send the email: the connection to ${where} was refused`,
          'check TRENDBRIEF_SMTP_HOST and TRENDBRIEF_SMTP_PORT, and that the server is running',
        );
      }
      return sendError(
        'smtp-failed',
        `cannot send the email through ${where}: ${text}${said}`,
        'check the TRENDBRIEF_SMTP_* settings; run with --debug for details',
      );
    }
  }
}

function sendError(code: string, message: string, hint: string): BriefError {
  return new BriefError(code, message, hint, {}, 1);
}

function oneLine(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}
