/**
 * Sends a finished .eml over SMTP (RFC 5321) with nodemailer, byte for byte as written: the message is
 * handed over raw, so what arrives is the file on disk. The server and its credentials come from the
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
import { createTransport } from 'nodemailer';
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
}

export interface Envelope {
  from: string | null;
  to: string[];
}

export interface SendResult {
  accepted: string[];
  response: string;
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

/** Sends the message as is to every envelope recipient; resolves once the server has accepted it. */
export async function sendEmail(eml: Buffer, envelope: Envelope, settings: SmtpSettings): Promise<SendResult> {
  const { from, to } = checkEnvelope(envelope);
  const timeout = settings.timeout ?? 20_000;
  const transport = createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    // A password never crosses the network in the clear: with credentials and no TLS, STARTTLS is required.
    requireTLS: settings.user !== null && !settings.secure && !settings.ignoreTLS,
    ignoreTLS: settings.ignoreTLS ?? false,
    auth: settings.user !== null ? { user: settings.user, pass: settings.password ?? '' } : undefined,
    connectionTimeout: timeout,
    greetingTimeout: timeout,
    socketTimeout: timeout,
  });
  const where = `${settings.host}:${settings.port}`;
  try {
    const info = await transport.sendMail({ envelope: { from, to }, raw: eml });
    const rejected = (info.rejected ?? []).map(String);
    if (rejected.length > 0) {
      throw sendError(
        'smtp-rejected',
        `the SMTP server at ${where} refused ${rejected.join(', ')} (the others got the email)`,
        'check the addresses in brief.email.to and cc, or --to',
      );
    }
    return { accepted: (info.accepted ?? []).map(String), response: oneLine(String(info.response ?? '')) };
  } catch (e) {
    if (e instanceof BriefError) throw e;
    throw explain(e as SmtpFailure, where);
  } finally {
    transport.close();
  }
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
  command?: string;
}

/** One line for each way sending fails, with what to try next. */
function explain(e: SmtpFailure, where: string): BriefError {
  const said = e.response ? ` (server said: ${oneLine(e.response)})` : '';
  const text = oneLine(e.message ?? String(e));
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
