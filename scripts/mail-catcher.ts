// A local SMTP server for development and tests: accepts every message on 127.0.0.1 and saves it
// under MAIL_OUTBOX_DIR as <id>.eml, with a <id>.json summary that the Outbox page reads.
// It never relays anything anywhere. To try the failure path, an address whose local part starts
// with `refuse-once` is refused the first time the catcher sees it, and accepted after that.
import { randomBytes } from 'node:crypto';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const url = new URL(process.env.SMTP_URL ?? 'smtp://127.0.0.1:2525');
const port = Number(url.port || 25);
const outbox = path.resolve(process.env.MAIL_OUTBOX_DIR ?? 'var/mail');
const MAX_BYTES = 30 * 1024 * 1024;

/** Writes through a temporary name and renames, so a reader never sees half a file. */
async function writeAtomic(file: string, data: Buffer | string) {
  const temp = `${file}.${process.pid}.partial`;
  await writeFile(temp, data);
  await rename(temp, file);
}

const addresses = (a: AddressObject | AddressObject[] | undefined) => (a ? (Array.isArray(a) ? a : [a]).flatMap((x) => x.value.map((v) => v.address ?? '')).filter(Boolean) : []);

async function save(raw: Buffer, envelopeTo: string[]): Promise<string> {
  const id = `${Date.now()}-${randomBytes(6).toString('hex')}`;
  await writeAtomic(path.join(outbox, `${id}.eml`), raw);
  const parsed = await simpleParser(raw);
  const studio = parsed.headers.get('x-takeproof-studio');
  const summary = {
    receivedAt: new Date().toISOString(),
    from: parsed.from?.text ?? '',
    to: addresses(parsed.to).length ? addresses(parsed.to) : envelopeTo,
    subject: parsed.subject ?? '',
    messageId: parsed.messageId ?? null,
    studioId: studio == null ? null : Number(String(studio)),
    attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? '', contentType: a.contentType, size: a.size })),
    text: (parsed.text ?? '').slice(0, 200_000),
  };
  await writeAtomic(path.join(outbox, `${id}.json`), JSON.stringify(summary, null, 2));
  return id;
}

await mkdir(outbox, { recursive: true });
const refusedOnce = new Set<string>();

const server = new SMTPServer({
  name: 'takeproof-mail-catcher',
  banner: 'Takeproof local mail catcher; messages are saved, never relayed',
  authOptional: true,
  disabledCommands: ['AUTH', 'STARTTLS'],
  size: MAX_BYTES,
  logger: false,
  onRcptTo(address, _session, callback) {
    const to = address.address.toLowerCase();
    if (to.startsWith('refuse-once') && !refusedOnce.has(to)) {
      refusedOnce.add(to);
      callback(Object.assign(new Error(`Mailbox ${to} is not available right now`), { responseCode: 550 }));
      return;
    }
    callback();
  },
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on('data', (c: Buffer) => chunks.push(c));
    stream.on('end', () => {
      if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) {
        callback(Object.assign(new Error('Message is larger than this catcher accepts'), { responseCode: 552 }));
        return;
      }
      const to = session.envelope.rcptTo.map((r) => r.address);
      save(Buffer.concat(chunks), to).then(
        (id) => {
          console.log(`caught ${id} for ${to.join(', ')}`);
          callback(null, `Saved as ${id}`);
        },
        (error: Error) => {
          console.error(`could not save a message: ${error.message}`);
          callback(Object.assign(new Error('Could not save the message'), { responseCode: 451 }));
        },
      );
    });
  },
});

server.on('error', (error) => console.error(`mail catcher: ${error.message}`));
server.listen(port, '127.0.0.1', () => console.log(`Mail catcher on 127.0.0.1:${port}, saving to ${path.relative(process.cwd(), outbox) || '.'}`));

const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
