import { createHash } from 'node:crypto';
import http from 'node:http';
import { Readable } from 'node:stream';
import type { Client } from './http';
import { streamingHeader } from './wavWriter';

/**
 * A generated 48 kHz/24-bit stereo WAV of about `totalBytes` as a stream, never held in memory,
 * with its exact size and the SHA-256 of what it produced (read once the stream has ended).
 */
export function generatedWav(totalBytes: number, seed = 0) {
  const dataBytes = totalBytes - 44 - ((totalBytes - 44) % 6);
  const header = streamingHeader({ sampleRate: 48000, channels: 2, coding: 'pcm24' }, dataBytes);
  const chunk = Buffer.alloc(1024 * 1024);
  for (let i = 0; i < chunk.length; i++) chunk[i] = ((i + seed * 7919) * 2654435761) >>> 24;
  const hash = createHash('sha256');
  async function* bytes() {
    hash.update(header);
    yield header;
    for (let sent = 0; sent < dataBytes; sent += chunk.length) {
      const piece = dataBytes - sent >= chunk.length ? chunk : chunk.subarray(0, dataBytes - sent);
      hash.update(piece);
      yield piece;
    }
  }
  return { stream: Readable.from(bytes()), size: header.length + dataBytes, sha256: () => hash.digest('hex') };
}

/**
 * Streams a generated WAV of about `totalBytes` to a session's upload route in one multipart request,
 * hashing what it sends. Resolves with the HTTP status, the SHA-256 sent and the one stored.
 */
export function streamGeneratedUpload(client: Client, baseUrl: string, sessionId: number, totalBytes: number, fileName: string, seed = 0) {
  const source = generatedWav(totalBytes, seed);
  const boundary = `takeproof${seed}x${Date.now()}`;
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: audio/wav\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  return new Promise<{ status: number; sent: string; stored: string | undefined }>((resolve, reject) => {
    const request = http.request(new URL(`/api/sessions/${sessionId}/takes`, baseUrl), {
      method: 'POST',
      headers: { cookie: client.cookieHeader(), origin: new URL(baseUrl).origin, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': head.length + source.size + tail.length },
    });
    request.on('response', (res) => {
      let body = '';
      res.on('data', (d) => (body += d));
      res.on('end', () => {
        let stored: string | undefined;
        try {
          stored = JSON.parse(body).takes?.[0]?.sha256;
        } catch {
          stored = undefined;
        }
        resolve({ status: res.statusCode ?? 0, sent: source.sha256(), stored });
      });
    });
    request.on('error', reject);
    request.write(head);
    source.stream.on('end', () => request.end(tail));
    source.stream.pipe(request, { end: false });
  });
}
