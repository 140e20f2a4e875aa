import { formatBytes } from '@/lib/format';

const WAV_CONTAINERS = new Set(['RIFF', 'RF64', 'BW64']);

/**
 * What the browser can tell about a file before sending it: whether it fits the studio's size
 * limit and starts with a WAV header. The server checks both again; this only spares a long
 * upload that would be refused at the end. Null when the file may be sent.
 */
export async function fileRefusal(file: File, maxBytes: number): Promise<string | null> {
  if (file.size > maxBytes) return `“${file.name}” is ${formatBytes(file.size)}, larger than the ${formatBytes(maxBytes)} this studio accepts. Nothing was sent.`;
  if (file.size < 12) return `“${file.name}” is too short to be a WAV file. Nothing was sent.`;
  const head = new Uint8Array(await file.slice(0, 12).arrayBuffer());
  const text = (from: number, to: number) => String.fromCharCode(...head.subarray(from, to));
  if (!WAV_CONTAINERS.has(text(0, 4)) || text(8, 12) !== 'WAVE') return `“${file.name}” is not a WAV file (it does not start with a RIFF/RF64 WAVE header). Nothing was sent.`;
  return null;
}
