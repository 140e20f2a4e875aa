import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { BASE_URL, signedInAll, type Client, type DemoPerson } from '../support/http';
import { countMailTo, mailTo, uniqueAddress } from '../support/mail';
import { concat, dbToAmplitude, silence, sine } from '../support/testSignals';
import { encodeSamples, wavFile } from '../support/wavWriter';

let as: Record<DemoPerson | 'anonymous', Client>;
let sessionId: number;
let emptySessionId: number;
const TITLE = `Lantern Street Stories — episode ${Date.now() % 100000}`;
const TAKE_NAMES = ['scene-3-take-1.wav', '=SUM(A1)+take-2.wav'];

interface TakeRow {
  originalName: string;
  status: string;
  verdict: string | null;
  reason: string | null;
  decision: string;
  truePeakDbtp: number | null;
  integratedLufs: number | null;
  clipEvents: number | null;
  format: { sampleRate: number | null };
}

/** RFC 4180 reader, enough for the report's CSV. */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(field);
      field = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(field);
      rows.push(row);
      row = [];
      field = '';
      i++;
    } else field += c;
  }
  if (field || row.length) {
    row.push(field);
    rows.push(row);
  }
  return rows;
}

function pdfText(pdf: Buffer): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'report-pdf-'));
  const file = path.join(dir, 'report.pdf');
  writeFileSync(file, pdf);
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

async function upload(client: Client, id: number, name: string, seconds: number, levelDb: number) {
  const rate = 48000;
  // A sine swelling at 3 Hz: programme with a loudness (a steady sine alone is a line-up tone, left out of loudness).
  const swelling = sine(997, dbToAmplitude(levelDb), seconds, rate).map((x, n) => x * (0.75 + 0.25 * Math.sin((2 * Math.PI * 3 * n) / rate)));
  const signal = concat(silence(0.3, rate), swelling, silence(0.3, rate));
  const wav = wavFile({ sampleRate: rate, channels: 1, coding: 'pcm24' }, encodeSamples([signal], 'pcm24'));
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(wav)], { type: 'audio/wav' }), name);
  const response = await client.fetch(`/api/sessions/${id}/takes`, { method: 'POST', body: form });
  expect(response.status, await response.clone().text()).toBe(201);
}

async function takesOf(id: number): Promise<TakeRow[]> {
  return (await (await as.producer.fetch(`/api/sessions/${id}/takes`)).json()).takes;
}

async function sendReport(client: Client, id: number, body: unknown) {
  const response = await client.fetch(`/api/sessions/${id}/report`, { method: 'POST', json: body, headers: { origin: BASE_URL } });
  return { status: response.status, body: await response.json() };
}

/** Waits until the worker has sent the report from the outbox, or given up on it, and returns its record. */
async function settled(id: number, deliveryId: number) {
  const until = Date.now() + 60_000;
  for (;;) {
    const { deliveries } = await (await as.producer.fetch(`/api/sessions/${id}/report`)).json();
    const found = deliveries.find((d: { id: number }) => d.id === deliveryId);
    if (found && (found.status === 'sent' || found.status === 'failed')) return found;
    if (Date.now() > until) throw new Error(`Report e-mail ${deliveryId} is still ${found?.status}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

beforeAll(async () => {
  as = await signedInAll();
  const created = await as.manager.fetch('/api/sessions', { method: 'POST', json: { title: TITLE, client: 'Lantern Street podcast', room: 'Booth B' } });
  sessionId = (await created.json()).id;
  const empty = await as.manager.fetch('/api/sessions', { method: 'POST', json: { title: `Empty pickup session ${Date.now()}` } });
  emptySessionId = (await empty.json()).id;
  await upload(as.engineer, sessionId, TAKE_NAMES[0], 3, -20);
  await upload(as.engineer, sessionId, TAKE_NAMES[1], 2, -6);
  // Wait until the worker has measured both takes, so the report has numbers in it.
  const deadline = Date.now() + 90_000;
  while (Date.now() < deadline) {
    const takes = await takesOf(sessionId);
    if (takes.length === 2 && takes.every((t) => t.status === 'measured' || t.status === 'unreadable')) break;
    await new Promise((r) => setTimeout(r, 500));
  }
});

describe('sending a session report', () => {
  it('mails the report through SMTP with the take table, a PDF and a CSV that match the takes', async () => {
    const to = uniqueAddress('mix-desk');
    const { status, body } = await sendReport(as.producer, sessionId, { to: [to], message: 'Scene 3 is ready for the edit.' });
    expect(status).toBe(202);
    // The report waits in the outbox; a worker sends it.
    expect(body.delivery).toMatchObject({ status: 'queued', recipients: [to], error: null, sentBy: 'Tomasz Okafor' });
    const sent = await settled(sessionId, body.delivery.id);
    expect(sent).toMatchObject({ status: 'sent', error: null, attempts: 1 });

    const { mail } = await mailTo(to);
    expect(mail.subject).toContain(TITLE);
    expect(mail.messageId).toBe(sent.messageId);
    const html = String(mail.html);
    expect(html).toContain(TITLE);
    expect(html).toContain('Scene 3 is ready for the edit.');
    for (const name of TAKE_NAMES) expect(html).toContain(name);
    expect(html).toMatch(/delivery specs and local rules take precedence/);
    expect(mail.text).toContain(TAKE_NAMES[0]);
    // The e-mail links back to the session's page.
    expect(html).toMatch(new RegExp(`href="https?://[^"]+/sessions/${sessionId}"`));
    expect(mail.text).toMatch(new RegExp(`https?://\\S+/sessions/${sessionId}\\b`));

    const takes = await takesOf(sessionId);
    expect(takes).toHaveLength(2);
    expect(takes.map((t) => t.status)).toEqual(['measured', 'measured']);
    // The key measures appear with their units.
    for (const t of takes) {
      expect(html).toContain(`${t.truePeakDbtp!.toFixed(1)} dBTP`);
      expect(html).toContain(`${t.integratedLufs!.toFixed(1)} LUFS`);
    }
    // Status always has a word (and a mark) beside any colour.
    for (const t of takes) {
      const word = { pass: '✓ Pass', warn: '▲ Warn', fail: '✕ Fail' }[t.verdict ?? ''] ?? '◌ Not measured';
      expect(html).toContain(word);
      // A warning or failure says why, beside its verdict.
      if (t.reason) expect(html).toContain(t.reason.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;'));
    }

    const pdf = mail.attachments.find((a) => a.contentType === 'application/pdf');
    const csv = mail.attachments.find((a) => a.contentType.startsWith('text/csv'));
    expect(pdf?.filename).toMatch(/^session-\d+-lantern-street-stories-episode-\d+-report\.pdf$/);
    expect(csv?.filename).toMatch(/\.csv$/);

    const text = pdfText(pdf!.content);
    expect(text).toContain(TITLE);
    expect(text).toContain('Lanternfish Audio Works');
    expect(text).toContain(TAKE_NAMES[0]);
    expect(text).toMatch(/Pending 2/);
    expect(text.replace(/\s+/g, ' ')).toMatch(/delivery specs and local rules take precedence/);

    const rows = parseCsv(csv!.content.toString('utf8').replace(/^\ufeff/, ''));
    expect(rows[0][0]).toBe('Take');
    const col = (title: string) => rows[0].indexOf(title);
    expect(rows.slice(1)).toHaveLength(takes.length);
    takes.forEach((t, i) => {
      const row = rows[i + 1];
      // A name that a spreadsheet would run as a formula is defused with a leading apostrophe.
      expect(row[col('Take')]).toBe(t.originalName.startsWith('=') ? `'${t.originalName}` : t.originalName);
      expect(row[col('Verdict')]).toBe({ pass: 'Pass', warn: 'Warn', fail: 'Fail' }[t.verdict ?? ''] ?? 'Not measured');
      expect(row[col('Reason')]).toBe(t.reason ?? '');
      expect(row[col('Decision')]).toBe({ pending: 'Pending', approved: 'Approved', rejected: 'Rejected' }[t.decision]);
      expect(row[col('Sample rate (Hz)')]).toBe(String(t.format.sampleRate));
      const tp = row[col('True peak (dBTP)')];
      if (t.truePeakDbtp == null) expect(tp).toBe('');
      else expect(Number(tp)).toBeCloseTo(t.truePeakDbtp, 1);
      const lufs = row[col('Integrated loudness (LUFS)')];
      if (t.integratedLufs == null) expect(lufs).toBe('');
      else expect(Number(lufs)).toBeCloseTo(t.integratedLufs, 1);
    });
    expect(rows.map((r) => r[col('Take')])).toContain("'=SUM(A1)+take-2.wav");
  });

  it('records each delivery and the send in the audit log', async () => {
    const to = uniqueAddress('archive');
    const { body } = await sendReport(as.manager, sessionId, { to: [to] });
    const { mail } = await mailTo(to);
    const recorded = await settled(sessionId, body.delivery.id);
    expect(recorded).toMatchObject({ status: 'sent', recipients: [to], messageId: mail.messageId, sentBy: 'Maren Lindqvist', attempts: 1 });
    expect(Date.parse(recorded.sentAt)).toBeGreaterThan(Date.now() - 120_000);
    const audit = await (await as.manager.fetch(`/api/audit?action=session.report_send&subjectType=session`)).json();
    expect(audit.events.some((e: { subjectId: number; detail: { deliveryId: number } }) => e.subjectId === sessionId && e.detail.deliveryId === body.delivery.id)).toBe(true);
  });

  it('reports an empty session too', async () => {
    const to = uniqueAddress('empty');
    const { status, body } = await sendReport(as.producer, emptySessionId, { to: [to] });
    expect(status).toBe(202);
    expect((await settled(emptySessionId, body.delivery.id)).status).toBe('sent');
    const { mail } = await mailTo(to);
    expect(String(mail.html)).toContain('No takes have been uploaded');
    const pdf = mail.attachments.find((a) => a.contentType === 'application/pdf')!;
    expect(pdfText(pdf.content)).toContain('No takes have been uploaded');
    const csv = mail.attachments.find((a) => a.contentType.startsWith('text/csv'))!;
    expect(parseCsv(csv.content.toString('utf8').replace(/^\ufeff/, ''))).toHaveLength(1);
  });

  it('shows a plain error when the mail server refuses, and sends on retry', async () => {
    const to = uniqueAddress('refuse-once');
    const { status, body } = await sendReport(as.producer, sessionId, { to: [to] });
    expect(status).toBe(202);
    // A recipient the mail server refuses outright is not tried again by itself.
    const refused = await settled(sessionId, body.delivery.id);
    expect(refused).toMatchObject({ status: 'failed', attempts: 1 });
    expect(refused.error).toContain(to);
    expect(refused.error).toMatch(/refused the recipient/);
    expect(await countMailTo(to)).toBe(0);
    // Another studio cannot retry it, an engineer may not.
    expect((await as.outsider.fetch(`/api/deliveries/${body.delivery.id}/retry`, { method: 'POST' })).status).toBe(404);
    expect((await as.engineer.fetch(`/api/deliveries/${body.delivery.id}/retry`, { method: 'POST' })).status).toBe(403);
    const retried = await as.producer.fetch(`/api/deliveries/${body.delivery.id}/retry`, { method: 'POST', headers: { origin: BASE_URL } });
    expect(retried.status).toBe(202);
    expect((await retried.json()).delivery).toMatchObject({ id: body.delivery.id, status: 'queued' });
    expect(await settled(sessionId, body.delivery.id)).toMatchObject({ status: 'sent', attempts: 2, error: null });
    const { mail } = await mailTo(to);
    expect(mail.subject).toContain(TITLE);
    // A sent e-mail is not sent twice by accident.
    expect((await as.producer.fetch(`/api/deliveries/${body.delivery.id}/retry`, { method: 'POST' })).status).toBe(409);
  });
});

describe('validating the report request', () => {
  it('names each wrong recipient and the limits exactly', async () => {
    const cases: [unknown, Record<string, string[]>][] = [
      [{ to: [] }, { to: ['Add at least one recipient'] }],
      [{}, { to: ['Add at least one recipient'] }],
      [{ to: ['ok@demo.test', 'not-an-address'] }, { 'to.1': ['“not-an-address” is not a valid e-mail address'] }],
      [{ to: Array.from({ length: 21 }, (_, i) => `person${i}@demo.test`) }, { to: ['Send the report to 20 recipients at most'] }],
      [{ to: ['ok@demo.test'], message: 'x'.repeat(2001) }, { message: ['Keep the message under 2000 characters'] }],
    ];
    for (const [payload, fields] of cases) {
      const { status, body } = await sendReport(as.producer, sessionId, payload);
      expect(status).toBe(400);
      expect(body.fields).toEqual(fields);
    }
  });

  it('accepts 20 recipients and a 2000-character message', async () => {
    const to = Array.from({ length: 20 }, () => uniqueAddress('crew'));
    const { status, body } = await sendReport(as.producer, emptySessionId, { to, message: 'y'.repeat(2000) });
    expect(status).toBe(202);
    expect(body.delivery.recipients).toHaveLength(20);
    expect((await mailTo(to[19])).to).toHaveLength(20);
  });
});

describe('who may send and download', () => {
  it('refuses an engineer (403), another studio (404) and a signed-out visitor (401), and sends nothing', async () => {
    const to = uniqueAddress('nobody');
    const engineer = await sendReport(as.engineer, sessionId, { to: [to] });
    expect(engineer.status).toBe(403);
    expect(engineer.body.error).toBe('forbidden:report:send');
    expect((await sendReport(as.outsider, sessionId, { to: [to] })).status).toBe(404);
    expect((await sendReport(as.anonymous, sessionId, { to: [to] })).status).toBe(401);
    expect((await as.engineer.fetch(`/api/sessions/${sessionId}/report`)).status).toBe(403);
    expect((await as.outsider.fetch(`/api/sessions/${sessionId}/report`)).status).toBe(404);
    await new Promise((r) => setTimeout(r, 500));
    expect(await countMailTo(to)).toBe(0);
  });

  it('downloads the PDF and the CSV with safe file names', async () => {
    const pdf = await as.producer.fetch(`/api/sessions/${sessionId}/report.pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get('content-type')).toBe('application/pdf');
    expect(pdf.headers.get('content-disposition')).toMatch(/^attachment; filename="session-\d+-[a-z0-9-]+-report\.pdf"$/);
    const text = pdfText(Buffer.from(await pdf.arrayBuffer()));
    expect(text).toContain(TITLE);
    expect(text).toContain(TAKE_NAMES[0]);

    const csv = await as.engineer.fetch(`/api/sessions/${sessionId}/report.csv`);
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(csv.headers.get('content-disposition')).toMatch(/^attachment; filename="session-\d+-[a-z0-9-]+-report\.csv"$/);
    const rows = parseCsv((await csv.text()).replace(/^\ufeff/, ''));
    expect(rows.slice(1).map((r) => r[0]).sort()).toEqual(["'=SUM(A1)+take-2.wav", 'scene-3-take-1.wav']);

    expect((await as.outsider.fetch(`/api/sessions/${sessionId}/report.pdf`)).status).toBe(404);
    expect((await as.anonymous.fetch(`/api/sessions/${sessionId}/report.csv`)).status).toBe(401);
  });
});
