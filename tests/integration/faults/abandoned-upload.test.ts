import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, DEMO } from '../../support/http';
import { makeWav } from '../../support/takes';
import { startExtraServer } from '../../support/testServices';

// A second web server from the same build whose unfinished resumable uploads expire after about a second
// (UPLOAD_RESUME_EXPIRY_HOURS), to see an abandoned upload removed. Requests follow the tus protocol 1.0.0.
let server: Awaited<ReturnType<typeof startExtraServer>> | null = null;

beforeAll(async () => {
  server = await startExtraServer(Number(process.env.PORT ?? 3100) + 41, { UPLOAD_RESUME_EXPIRY_HOURS: '0.0003' });
});
afterAll(() => {
  server?.child.kill('SIGTERM');
});

describe('fault drill: an abandoned resumable upload', () => {
  it('is removed once it is older than UPLOAD_RESUME_EXPIRY_HOURS', async () => {
    const client = new Client(server!.url);
    await client.signIn(DEMO.engineer);
    const origin = { origin: server!.url };
    const session = await (await client.fetch('/api/sessions', { method: 'POST', json: { title: 'Abandoned upload drill' }, headers: origin })).json();
    const take = makeWav({ seconds: 2, seed: 8801 });
    const create = () =>
      client.fetch(`/api/sessions/${session.id}/uploads`, {
        method: 'POST',
        headers: { ...origin, 'tus-resumable': '1.0.0', 'upload-length': String(take.length), 'upload-metadata': `filename ${Buffer.from('left-behind.wav').toString('base64')}` },
      });
    const created = await create();
    expect(created.status).toBe(201);
    const location = created.headers.get('location')!;
    const patch = await client.fetch(location, {
      method: 'PATCH',
      headers: { ...origin, 'tus-resumable': '1.0.0', 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' },
      body: new Uint8Array(take.subarray(0, 1000)),
    });
    expect(patch.status).toBe(204);
    const head = () => client.fetch(location, { method: 'HEAD', headers: { 'tus-resumable': '1.0.0' } });
    expect((await head()).headers.get('upload-offset')).toBe('1000');
    // Starting another upload clears the expired ones; poll (bounded) until the abandoned one is gone.
    let status = 200;
    for (let i = 0; i < 60 && status !== 404; i++) {
      await new Promise((r) => setTimeout(r, 250));
      await create();
      status = (await head()).status;
    }
    expect(status).toBe(404);
  });
});
