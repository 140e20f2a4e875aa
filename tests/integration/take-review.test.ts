import { beforeAll, describe, expect, it } from 'vitest';
import { signedInAll, type Client, type DemoPerson } from '../support/http';
import { CLIP_AT_SEC, DROPOUT_AT_SEC, createSession, hotInterviewTake, unreadableWav, uploadTake, waitMeasured } from '../support/reviewTakes';

let as: Record<DemoPerson | 'anonymous', Client>;
let file: Buffer;
let takeId: number;
let outsiderTakeId: number;

beforeAll(async () => {
  as = await signedInAll();
  file = hotInterviewTake(101);
  const sessionId = await createSession(as.engineer, 'Review checks — pickups');
  takeId = await uploadTake(as.engineer, sessionId, "it's (100%) hot take.wav", file);
  const outsideSession = await createSession(as.outsider, 'Outside studio check');
  outsiderTakeId = await uploadTake(as.outsider, outsideSession, 'outside.wav', hotInterviewTake(102));
  await waitMeasured(as.engineer, takeId);
}, 150_000);

async function bytesOf(response: Response): Promise<Buffer> {
  return Buffer.from(await response.arrayBuffer());
}

describe('GET /api/takes/:id/audio', () => {
  it('streams the whole stored file, byte for byte, and says ranges are accepted', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/audio`);
    expect(response.status).toBe(200);
    expect(response.headers.get('accept-ranges')).toBe('bytes');
    expect(response.headers.get('content-type')).toBe('audio/wav');
    expect((await bytesOf(response)).equals(file)).toBe(true);
  });

  it('answers bytes=0-1023 with 206 and exactly the first 1024 bytes of the upload', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/audio`, { headers: { range: 'bytes=0-1023' } });
    expect(response.status).toBe(206);
    expect(response.headers.get('content-range')).toBe(`bytes 0-1023/${file.length}`);
    const body = await bytesOf(response);
    expect(body.length).toBe(1024);
    expect(body.equals(file.subarray(0, 1024))).toBe(true);
  });

  it('answers a suffix range with the last bytes', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/audio`, { headers: { range: 'bytes=-500' } });
    expect(response.status).toBe(206);
    expect(response.headers.get('content-range')).toBe(`bytes ${file.length - 500}-${file.length - 1}/${file.length}`);
    expect((await bytesOf(response)).equals(file.subarray(file.length - 500))).toBe(true);
  });

  it('answers an open-ended range from the offset to the end', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/audio`, { headers: { range: 'bytes=1000-' } });
    expect(response.status).toBe(206);
    expect(response.headers.get('content-range')).toBe(`bytes 1000-${file.length - 1}/${file.length}`);
    expect((await bytesOf(response)).equals(file.subarray(1000))).toBe(true);
  });

  it('answers a range past the end with 416 and the real size', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/audio`, { headers: { range: `bytes=${file.length}-` } });
    expect(response.status).toBe(416);
    expect(response.headers.get('content-range')).toBe(`bytes */${file.length}`);
    expect((await response.json()).error).toBe('unsatisfiable:range');
  });

  it('sends the whole file for a multi-range request (documented: no multipart answers)', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/audio`, { headers: { range: 'bytes=0-1,10-20' } });
    expect(response.status).toBe(200);
    expect((await bytesOf(response)).length).toBe(file.length);
  });

  it('names the file for saving: an ASCII fallback plus the exact name in RFC 5987 form', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/audio?download=1`, { headers: { range: 'bytes=0-0' } });
    expect(response.headers.get('content-disposition')).toBe(`attachment; filename="it's (100_) hot take.wav"; filename*=UTF-8''it%27s%20%28100%25%29%20hot%20take.wav`);
    const inline = await as.producer.fetch(`/api/takes/${takeId}/audio`, { headers: { range: 'bytes=0-0' } });
    expect(inline.headers.get('content-disposition')?.startsWith('inline; ')).toBe(true);
    await response.arrayBuffer();
    await inline.arrayBuffer();
  });

  it('answers 401 signed out and 404 for another studio or a missing take', async () => {
    expect((await as.anonymous.fetch(`/api/takes/${takeId}/audio`)).status).toBe(401);
    expect((await as.outsider.fetch(`/api/takes/${takeId}/audio`)).status).toBe(404);
    expect((await as.producer.fetch(`/api/takes/${outsiderTakeId}/audio`)).status).toBe(404);
    expect((await as.producer.fetch('/api/takes/999999/audio')).status).toBe(404);
  });
});

describe('GET /api/takes/:id/peaks', () => {
  it('gives per-channel min/max envelopes for the waveform at the nearest zoom level', async () => {
    const response = await as.producer.fetch(`/api/takes/${takeId}/peaks?buckets=2000`);
    expect(response.status).toBe(200);
    const body = await response.json();
    expect(body.channels).toBe(2);
    expect(body.duration).toBeCloseTo(8, 2);
    expect(body.peaks).toHaveLength(2);
    const buckets = body.peaks[0].length / 2;
    expect(buckets).toBeLessThanOrEqual(2000);
    expect(buckets).toBeGreaterThan(100);
    // The right channel reaches full scale where it clips; the left never does.
    const maxOf = (values: number[]) => values.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
    expect(maxOf(body.peaks[1])).toBeGreaterThan(0.99);
    expect(maxOf(body.peaks[0])).toBeLessThan(0.5);
    const clipBucket = Math.floor((CLIP_AT_SEC + 0.1) / (body.duration / buckets));
    expect(Math.abs(body.peaks[1][2 * clipBucket + 1])).toBeGreaterThan(0.99);
    // A coarser request gets a coarser level.
    const coarse = await (await as.producer.fetch(`/api/takes/${takeId}/peaks?buckets=100`)).json();
    expect(coarse.peaks[0].length).toBeLessThan(body.peaks[0].length);
  });

  it('answers 400 for a bucket count that is not a number, and 404 elsewhere', async () => {
    expect((await as.producer.fetch(`/api/takes/${takeId}/peaks?buckets=lots`)).status).toBe(400);
    expect((await as.outsider.fetch(`/api/takes/${takeId}/peaks`)).status).toBe(404);
    expect((await as.anonymous.fetch(`/api/takes/${takeId}/peaks`)).status).toBe(401);
  });

  it('answers 404 with a clear message for a take that has no peaks (its file could not be read)', async () => {
    const sessionId = await createSession(as.engineer, 'Review checks — unreadable file');
    const id = await uploadTake(as.engineer, sessionId, 'broken.wav', unreadableWav());
    const deadline = Date.now() + 90_000;
    let take = await (await as.producer.fetch(`/api/takes/${id}`)).json();
    while (take.status !== 'unreadable' && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
      take = await (await as.producer.fetch(`/api/takes/${id}`)).json();
    }
    expect(take.status).toBe('unreadable');
    expect(take.hasPeaks).toBe(false);
    const response = await as.producer.fetch(`/api/takes/${id}/peaks`);
    expect(response.status).toBe(404);
    const body = await response.json();
    expect(body.error).toBe('not_found:peaks');
    expect(body.message).toBe('There is no waveform for this take yet: the file could not be read.');
  });
});

describe('POST /api/takes/:id/decision', () => {
  const decide = (client: Client, id: number, json: unknown) => client.fetch(`/api/takes/${id}/decision`, { method: 'POST', json });

  it('lets the producer approve with a note, and shows who decided and when', async () => {
    const response = await decide(as.producer, takeId, { decision: 'approved', note: 'Usable from 0:07.' });
    expect(response.status).toBe(200);
    const take = await response.json();
    expect(take.decision).toBe('approved');
    expect(take.decisionNote).toBe('Usable from 0:07.');
    expect(take.decidedBy).toBe('Tomasz Okafor');
    expect(Date.now() - Date.parse(take.decidedAt)).toBeLessThan(60_000);
    expect((await (await as.engineer.fetch(`/api/takes/${takeId}`)).json()).decision).toBe('approved');
  });

  it('answers 400 with a field error when rejecting without a reason, and changes nothing', async () => {
    for (const body of [{ decision: 'rejected' }, { decision: 'rejected', note: '   ' }]) {
      const response = await decide(as.producer, takeId, body);
      expect(response.status).toBe(400);
      expect((await response.json()).fields.note[0]).toMatch(/why the take is rejected/);
    }
    expect((await (await as.producer.fetch(`/api/takes/${takeId}`)).json()).decision).toBe('approved');
  });

  it('answers 400 for an unknown decision', async () => {
    const response = await decide(as.producer, takeId, { decision: 'maybe' });
    expect(response.status).toBe(400);
    expect((await response.json()).fields.decision).toBeTruthy();
  });

  it('rejects with a reason, and the manager can reopen', async () => {
    const rejected = await decide(as.producer, takeId, { decision: 'rejected', note: 'Guest clips at 0:04.' });
    expect(rejected.status).toBe(200);
    expect((await rejected.json()).decision).toBe('rejected');
    const reopened = await decide(as.manager, takeId, { decision: 'pending' });
    expect(reopened.status).toBe(200);
    const take = await reopened.json();
    expect(take.decision).toBe('pending');
    expect(take.decidedBy).toBeNull();
    expect(take.decidedAt).toBeNull();
  });

  it('records every decision in the audit log, with who made it', async () => {
    const response = await as.manager.fetch('/api/audit?action=take.decide&subjectType=take');
    expect(response.status).toBe(200);
    const events = ((await response.json()).events as { action: string; subjectId: number; actor: { name: string } | null }[]).filter((e) => e.subjectId === takeId);
    // approve, reject (producer), reopen (manager); the refused attempts left no trace.
    expect(events.map((e) => e.actor?.name)).toEqual(['Maren Lindqvist', 'Tomasz Okafor', 'Tomasz Okafor']);
  });

  it('refuses engineers (403), strangers (401) and other studios (404)', async () => {
    expect((await decide(as.engineer, takeId, { decision: 'approved' })).status).toBe(403);
    expect((await decide(as.anonymous, takeId, { decision: 'approved' })).status).toBe(401);
    expect((await decide(as.outsider, takeId, { decision: 'approved' })).status).toBe(404);
    expect((await (await as.producer.fetch(`/api/takes/${takeId}`)).json()).decision).toBe('pending');
  });
});

describe('/api/takes/:id/comments', () => {
  it('keeps time-stamped comments in time order for everyone in the studio', async () => {
    const later = await as.producer.fetch(`/api/takes/${takeId}/comments`, { method: 'POST', json: { atSec: DROPOUT_AT_SEC, body: 'Gap in the audio here' } });
    expect(later.status).toBe(201);
    const earlier = await as.producer.fetch(`/api/takes/${takeId}/comments`, { method: 'POST', json: { atSec: 1.5, body: 'Door slam' } });
    expect(earlier.status).toBe(201);
    const created = await earlier.json();
    expect(created.author.name).toBe('Tomasz Okafor');
    // The engineer sees them, earliest first.
    const list = await (await as.engineer.fetch(`/api/takes/${takeId}/comments`)).json();
    const mine = list.comments.filter((c: { body: string }) => c.body === 'Door slam' || c.body === 'Gap in the audio here');
    expect(mine.map((c: { atSec: number; body: string }) => [c.atSec, c.body])).toEqual([
      [1.5, 'Door slam'],
      [DROPOUT_AT_SEC, 'Gap in the audio here'],
    ]);
  });

  it('lets engineers comment too', async () => {
    const response = await as.engineer.fetch(`/api/takes/${takeId}/comments`, { method: 'POST', json: { atSec: 2, body: 'Re-recorded this line in take 4' } });
    expect(response.status).toBe(201);
  });

  it('answers 400 for an empty comment or a time past the end of the take', async () => {
    const empty = await as.producer.fetch(`/api/takes/${takeId}/comments`, { method: 'POST', json: { atSec: 1, body: '  ' } });
    expect(empty.status).toBe(400);
    expect((await empty.json()).fields.body).toBeTruthy();
    const late = await as.producer.fetch(`/api/takes/${takeId}/comments`, { method: 'POST', json: { atSec: 60, body: 'After the end' } });
    expect(late.status).toBe(400);
    expect((await late.json()).fields.atSec[0]).toMatch(/past the end/);
  });

  it('answers 404 to another studio and 401 signed out', async () => {
    expect((await as.outsider.fetch(`/api/takes/${takeId}/comments`)).status).toBe(404);
    expect((await as.outsider.fetch(`/api/takes/${takeId}/comments`, { method: 'POST', json: { atSec: 1, body: 'Hello' } })).status).toBe(404);
    expect((await as.anonymous.fetch(`/api/takes/${takeId}/comments`)).status).toBe(401);
  });
});
