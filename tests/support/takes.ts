import { readFileSync } from 'node:fs';
import type { Client } from './http';
import { seededRandom } from './testSignals';
import { encodeSamples, wavFile } from './wavWriter';

/**
 * A 24-bit (or 16-bit) PCM WAV of programme-like noise: a seeded generator, so every
 * call with the same arguments gives the same bytes (and the same SHA-256).
 */
export function makeWav({ seconds = 2, sampleRate = 48000, channels = 2, bits = 24, seed = 1, amplitude = 0.1 } = {}): Buffer {
  const frames = Math.round(seconds * sampleRate);
  const random = seededRandom(seed);
  const audio = Array.from({ length: channels }, () => new Float64Array(frames));
  for (let i = 0; i < frames; i++) for (const channel of audio) channel[i] = (2 * random() - 1) * amplitude;
  const coding = bits === 24 ? 'pcm24' : 'pcm16';
  return wavFile({ sampleRate, channels, coding }, encodeSamples(audio, coding));
}

export interface UploadFile {
  name: string;
  bytes: Buffer | Uint8Array;
}

export function sampleFile(fileName: string): UploadFile {
  return { name: fileName, bytes: readFileSync(`samples/${fileName}`) };
}

/** Posts files to the session's upload route as multipart/form-data, the way the browser does. */
export async function uploadTakes(client: Client, sessionId: number, files: UploadFile[], fields: Record<string, string> = {}) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  for (const f of files) form.append('file', new Blob([new Uint8Array(f.bytes)], { type: 'audio/wav' }), f.name);
  const response = await client.fetch(`/api/sessions/${sessionId}/takes`, { method: 'POST', body: form });
  return { status: response.status, body: await response.json() };
}

/** Polls a take until it leaves the queue (measured or unreadable), or fails after `timeoutMs`. */
export async function waitForTake(client: Client, takeId: number, timeoutMs = 90_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const take = await (await client.fetch(`/api/takes/${takeId}`)).json();
    if (take.status === 'measured' || take.status === 'unreadable') return take;
    if (Date.now() > until) throw new Error(`Take ${takeId} still ${take.status} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

export async function newSession(client: Client, title: string): Promise<number> {
  const response = await client.fetch('/api/sessions', { method: 'POST', json: { title } });
  if (response.status !== 201) throw new Error(`Could not create a session: ${response.status}`);
  return (await response.json()).id;
}
