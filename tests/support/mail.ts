import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';

/** The folder where the test server's mail catcher saves every message. */
export const OUTBOX_DIR = process.env.MAIL_OUTBOX_DIR ?? 'var/test/mail';

export interface CaughtMail {
  file: string;
  mail: ParsedMail;
  to: string[];
}

const recipients = (mail: ParsedMail) =>
  (Array.isArray(mail.to) ? mail.to : mail.to ? [mail.to] : []).flatMap((a) => a.value.map((v) => (v.address ?? '').toLowerCase()));

/** Every message caught so far (parsed from the .eml files, as a mail program would). */
export async function caughtMail(): Promise<CaughtMail[]> {
  let names: string[] = [];
  try {
    names = (await readdir(OUTBOX_DIR)).filter((n) => n.endsWith('.eml')).sort();
  } catch {
    return [];
  }
  return Promise.all(
    names.map(async (file) => {
      const mail = await simpleParser(await readFile(path.join(OUTBOX_DIR, file)));
      return { file, mail, to: recipients(mail) };
    }),
  );
}

/** Waits until a message to `address` has been caught, and returns the newest one. */
export async function mailTo(address: string, timeoutMs = 15_000): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await caughtMail()).filter((m) => m.to.includes(address.toLowerCase()));
    if (found.length) return found[found.length - 1];
    if (Date.now() > deadline) throw new Error(`No e-mail to ${address} arrived in ${OUTBOX_DIR}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

export async function countMailTo(address: string): Promise<number> {
  return (await caughtMail()).filter((m) => m.to.includes(address.toLowerCase())).length;
}

/** A fresh address nobody else in the test run uses. */
export function uniqueAddress(prefix: string): string {
  return `${prefix}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}@demo.test`;
}
