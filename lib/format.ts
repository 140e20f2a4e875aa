/**
 * How Takeproof writes values, for pages, tables, reports and e-mail alike. The measurement
 * words (clock times, kHz, levels with units, channel names, format descriptions) live in
 * dsp/format.ts, which the findings use too; this module re-exports them beside the web-only
 * helpers (bytes, file names, typed-in times). Safe to import from the browser.
 */
import { formatClock } from '@/dsp/format';

export { channelName, channelShortName, describeFormat, formatClock, formatKhz, formatMeasure, plural, type FormatFacts } from '@/dsp/format';

/** A take's length as m:ss (h:mm:ss past an hour); an em dash while it is unknown. */
export function formatDuration(seconds: number | null): string {
  return seconds == null ? '—' : formatClock(seconds, 0);
}

/** An instant as "2026-12-03 14:05 UTC": the one date-and-time format of pages, e-mail and PDF. */
export function formatDateTime(instant: string | Date): string {
  return `${new Date(instant).toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** A day as "2026-12-03" (UTC). */
export function formatDate(instant: string | Date): string {
  return new Date(instant).toISOString().slice(0, 10);
}

/**
 * A size in B, KiB, MiB or GiB: binary multiples named as such (IEC 80000-13), the one byte unit
 * of pages, messages and reports, so a file's size and the studio's limit always compare.
 */
export function formatBytes(n: number): string {
  if (n >= 1024 ** 3) return `${(n / 1024 ** 3).toFixed(2)} GiB`;
  if (n >= 1024 ** 2) return `${(n / 1024 ** 2).toFixed(1)} MiB`;
  if (n >= 1024) return `${Math.round(n / 1024)} KiB`;
  return `${n} B`;
}

/** Reads a time typed as seconds, m:ss(.s) or h:mm:ss(.s); null when it is not one. */
export function parseClock(text: string): number | null {
  const t = text.trim();
  if (!/^\d+(:\d{1,2}){0,2}(\.\d+)?$/.test(t)) return null;
  const parts = t.split(':').map(Number);
  if (parts.slice(1).some((p) => p >= 60)) return null;
  return parts.reduce((total, p) => total * 60 + p, 0);
}

/**
 * The text without C0/C1 control characters (line breaks, tabs, escapes), without the Unicode
 * bidirectional controls that make `…\u202Evaw.bat` read as `…tab.wav` (Unicode UAX #9), and without
 * halves of a UTF-16 surrogate pair (a name cut inside an emoji), which no database column keeps.
 */
export function withoutControlCharacters(text: string): string {
  // eslint-disable-next-line no-control-regex -- stripping control characters is the point
  return text.replace(/[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]|[\uD800-\uDFFF]/gu, '');
}

/** Half of a UTF-16 surrogate pair standing alone (with the `u` flag, whole pairs do not match). */
export const LONE_SURROGATE = /[\uD800-\uDFFF]/u;

/** Removes control characters and caps the length at whole characters; a take's name is only ever shown, never used as a path. */
export function cleanFileName(name: string): string {
  const cleaned = withoutControlCharacters(name).trim();
  return Array.from(cleaned || 'unnamed.wav').slice(0, 512).join('');
}
