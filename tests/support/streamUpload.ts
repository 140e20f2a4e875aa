import { createHash } from 'node:crypto';
import http from 'node:http';
import type { Client } from './http';
import { streamingHeader } from './wavWriter';


/**
 * Streams a generated WAV of about `totalBytes` to a session's upload route without holding it in
 * memory, hashing what it sends. Resolves with the HTTP status, the SHA-256 sent and the one stored.
 */
export function streamGeneratedUpload(client: Client, baseUrl: string, sessionId: number, totalBytes: number, fileName: string, seed = 0) {
  const dataBytes = totalBytes - 44 - ((totalBytes - 44) % 6);
  const boundary = `takeproof${seed}x${Date.now()}`;
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: audio/wav\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  const header = streamingHeader({ sampleRate: 48000, channels: 2, coding: 'pcm24' }, dataBytes);
  const chunk = Buffer.alloc(1024 * 1024);
  for (let i = 0; i < chunk.length; i++) chunk[i] = ((i + seed * 7919) * 2654435761) >>> 24;
  const hash = createHash('sha256').update(header);
  return new Promise<{ status: number; sent: string; stored: string | undefined }>((resolve, reject) => {
    const request = http.request(new URL(`/api/sessions/${sessionId}/takes`, baseUrl), {
      method: 'POST',
      headers: { cookie: client.cookieHeader(), origin: new URL(baseUrl).origin, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': head.length + header.length + dataBytes + tail.length },
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
        resolve({ status: res.statusCode ?? 0, sent: hash.digest('hex'), stored });
      });
    });
    request.on('error', reject);
    request.write(head);
    request.write(header);
    let sent = 0;
    const pump = () => {
      while (sent < dataBytes) {
        const piece = dataBytes - sent >= chunk.length ? chunk : chunk.subarray(0, dataBytes - sent);
        hash.update(piece);
        sent += piece.length;
        if (!request.write(piece)) return void request.once('drain', pump);
      }
      request.end(tail);
    };
    pump();
  });
}
