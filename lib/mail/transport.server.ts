import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { env } from '@/lib/env.server';

let transporter: Transporter | undefined;

/** The one SMTP connection pool of this process, over SMTP_URL. */
export function mailTransport(): Transporter {
  transporter ??= nodemailer.createTransport({
    url: env().SMTP_URL,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  } as Parameters<typeof nodemailer.createTransport>[0]);
  return transporter;
}

export interface OutgoingMail {
  to: string[];
  subject: string;
  html: string;
  text: string;
  attachments?: { filename: string; content: Buffer | string; contentType: string }[];
}

/** Turns a transport failure into a sentence a studio manager can act on. */
export function plainMailError(error: unknown): string {
  const e = error as { code?: string; responseCode?: number; response?: string; message?: string; rejected?: string[] };
  if (e.code === 'ECONNREFUSED' || e.code === 'ESOCKET' || e.code === 'ECONNECTION') {
    return 'The mail server could not be reached. Nothing was sent; try again in a moment.';
  }
  if (e.code === 'ETIMEDOUT') return 'The mail server did not answer in time. Nothing was sent; try again in a moment.';
  if (e.code === 'EENVELOPE') {
    const who = e.rejected?.length ? `: ${e.rejected.join(', ')}` : '';
    return `The mail server refused the recipient address${who}. Check it and try again.`;
  }
  const detail = (e.response ?? e.message ?? 'unknown reason').replace(/\s+/g, ' ').slice(0, 300);
  return `The mail server refused the message (${detail}).`;
}

/** Whether trying the same message again later may work: the server was unreachable, busy or answered 4xx. */
export function mayWorkLater(error: unknown): boolean {
  const e = error as { code?: string; responseCode?: number };
  if (typeof e.responseCode === 'number') return e.responseCode < 500;
  return e.code === 'ECONNREFUSED' || e.code === 'ESOCKET' || e.code === 'ECONNECTION' || e.code === 'ETIMEDOUT' || e.code === 'EDNS' || e.code === 'ECONNRESET';
}
