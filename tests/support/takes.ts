import { readFileSync } from 'node:fs';
import type { Client } from './http';

/**
 * A 24-bit (or 16-bit) PCM WAV of programme-like noise: a seeded generator, so every
 * call with the same arguments gives the same bytes (and the same SHA-256).
 */
export function makeWav({ seconds = 2, sampleRate = 48000, channels = 2, bits = 24, seed = 1, amplitude = 0.1 } = {}): Buffer {
  const frames = Math.round(seconds * sampleRate);
  const bytesPerSample = bits / 8;
  const dataBytes = frames * channels * bytesPerSample;
  const buffer = Buffer.alloc(44 + dataBytes);
  buffer.write('RIFF', 0, 'latin1');
  buffer.writeUInt32LE(36 + dataBytes, 4);
  buffer.write('WAVEfmt ', 8, 'latin1');
  buffer.writeUInt32LE(16, 16);
  buffer.writeUInt16LE(1, 20);
  buffer.writeUInt16LE(channels, 22);
  buffer.writeUInt32LE(sampleRate, 24);
  buffer.writeUInt32LE(sampleRate * channels * bytesPerSample, 28);
  buffer.writeUInt16LE(channels * bytesPerSample, 32);
  buffer.writeUInt16LE(bits, 34);
  buffer.write('data', 36, 'latin1');
  buffer.writeUInt32LE(dataBytes, 40);
  let state = seed >>> 0 || 1;
  const full = 2 ** (bits - 1) - 1;
  let offset = 44;
  for (let i = 0; i < frames * channels; i++) {
    // xorshift32: uniform in [-1, 1)
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    const value = Math.round(((state >>> 0) / 2 ** 31 - 1) * amplitude * full);
    if (bits === 24) buffer.writeIntLE(value, offset, 3);
    else buffer.writeInt16LE(value, offset);
    offset += bytesPerSample;
  }
  return buffer;
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
