import { UnreadableWavError } from '../reader/UnreadableWavError';

/** The one-line message for a file the tool refuses (not a WAV it reads, missing, unreadable), or null for a crash. */
export function refusal(error: unknown, file: string): string | null {
  if (error instanceof UnreadableWavError) return `Cannot analyse ${file}: ${error.message}`;
  const code = (error as NodeJS.ErrnoException).code;
  if (code === 'ENOENT' || code === 'EACCES' || code === 'EISDIR') return `Cannot open ${file} (${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a directory' : 'permission denied'}).`;
  return null;
}
