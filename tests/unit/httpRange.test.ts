import { describe, expect, it } from 'vitest';
import { contentDisposition, contentRange, parseRange, safeFileName } from '@/lib/http/range';

const SIZE = 10_000;

describe('parseRange', () => {
  it('sends the whole file when there is no Range header', () => {
    expect(parseRange(null, SIZE)).toEqual({ kind: 'full' });
    expect(parseRange(undefined, SIZE)).toEqual({ kind: 'full' });
  });

  it('answers a closed range with exactly those bytes', () => {
    expect(parseRange('bytes=0-1023', SIZE)).toEqual({ kind: 'partial', start: 0, end: 1023 });
    expect(parseRange('bytes=500-500', SIZE)).toEqual({ kind: 'partial', start: 500, end: 500 });
  });

  it('clamps an end past the last byte', () => {
    expect(parseRange('bytes=9000-20000', SIZE)).toEqual({ kind: 'partial', start: 9000, end: 9999 });
  });

  it('answers a suffix range with the last bytes, or the whole file when it is shorter', () => {
    expect(parseRange('bytes=-500', SIZE)).toEqual({ kind: 'partial', start: 9500, end: 9999 });
    expect(parseRange('bytes=-20000', SIZE)).toEqual({ kind: 'partial', start: 0, end: 9999 });
  });

  it('answers an open-ended range up to the last byte', () => {
    expect(parseRange('bytes=1000-', SIZE)).toEqual({ kind: 'partial', start: 1000, end: 9999 });
    expect(parseRange('bytes=9999-', SIZE)).toEqual({ kind: 'partial', start: 9999, end: 9999 });
  });

  it('calls a range that starts at or past the end unsatisfiable', () => {
    expect(parseRange('bytes=10000-', SIZE)).toEqual({ kind: 'unsatisfiable' });
    expect(parseRange('bytes=20000-30000', SIZE)).toEqual({ kind: 'unsatisfiable' });
    expect(parseRange('bytes=-0', SIZE)).toEqual({ kind: 'unsatisfiable' });
    expect(parseRange('bytes=0-', 0)).toEqual({ kind: 'unsatisfiable' });
    expect(parseRange('bytes=-10', 0)).toEqual({ kind: 'unsatisfiable' });
  });

  it('accepts the unit in any case and blanks around the numbers', () => {
    expect(parseRange('Bytes=0-9', SIZE)).toEqual({ kind: 'partial', start: 0, end: 9 });
    expect(parseRange('bytes= 10 - 19 ', SIZE)).toEqual({ kind: 'partial', start: 10, end: 19 });
  });

  it.each([
    ['another unit', 'items=0-10'],
    ['no equals sign', 'bytes 0-10'],
    ['no dash', 'bytes=100'],
    ['letters', 'bytes=a-b'],
    ['a fraction', 'bytes=1.5-20'],
    ['a negative start', 'bytes=--5'],
    ['a reversed range', 'bytes=500-100'],
    ['an empty list', 'bytes='],
    ['only a dash', 'bytes=-'],
    ['a number too long to be a byte offset', 'bytes=0-12345678901234567890'],
    ['hex', 'bytes=0x10-0x20'],
    ['an empty header', ''],
  ])('ignores a malformed header (%s) and sends the whole file', (_what, header) => {
    expect(parseRange(header, SIZE)).toEqual({ kind: 'full' });
  });

  it('ignores several ranges and sends the whole file (no multipart answers)', () => {
    expect(parseRange('bytes=0-1,5-9', SIZE)).toEqual({ kind: 'full' });
    expect(parseRange('bytes=0-1, -5', SIZE)).toEqual({ kind: 'full' });
    expect(parseRange('bytes=0-1,', SIZE)).toEqual({ kind: 'full' });
  });

  it('formats Content-Range', () => {
    expect(contentRange(0, 1023, SIZE)).toBe('bytes 0-1023/10000');
  });
});

/** Splits a Content-Disposition value into its ASCII fallback and its decoded UTF-8 name. */
function names(header: string): { ascii: string; utf8: string } {
  const ascii = /filename="([^"]*)"/.exec(header)?.[1];
  const star = /filename\*=UTF-8''([^;\s]*)/.exec(header)?.[1];
  if (ascii === undefined || star === undefined) throw new Error(`Both filename parameters expected in ${header}`);
  return { ascii, utf8: decodeURIComponent(star) };
}

describe('contentDisposition', () => {
  it('offers a plain name unchanged in both parameters', () => {
    const header = contentDisposition('Scene 17 take 3.wav');
    expect(header.startsWith('inline; ')).toBe(true);
    expect(names(header)).toEqual({ ascii: 'Scene 17 take 3.wav', utf8: 'Scene 17 take 3.wav' });
    expect(contentDisposition('a.wav', 'attachment').startsWith('attachment; ')).toBe(true);
  });

  it('keeps only the last path segment of names with separators', () => {
    expect(names(contentDisposition('../../etc/passwd')).utf8).toBe('passwd.wav');
    expect(names(contentDisposition('C:\\Users\\x\\take.wav')).utf8).toBe('take.wav');
    expect(names(contentDisposition('folder/')).utf8).toBe('take.wav');
    expect(names(contentDisposition('..')).utf8).toBe('take.wav');
  });

  it('always offers a take as .wav, whatever extension it was uploaded with', () => {
    // A RIFF…WAVE file named .html or .bat must not be saved as a page or a script.
    expect(names(contentDisposition('take 4.html')).utf8).toBe('take 4.wav');
    expect(names(contentDisposition('TAKE.BAT')).utf8).toBe('TAKE.wav');
    expect(names(contentDisposition('Take 7.WAV')).utf8).toBe('Take 7.wav');
    expect(names(contentDisposition('no extension')).utf8).toBe('no extension.wav');
  });

  it('drops bidirectional controls that would disguise the extension (Unicode UAX #9)', () => {
    // U+202E RIGHT-TO-LEFT OVERRIDE makes "take\u202Evaw.bat" display as "taketab.wav".
    expect(names(contentDisposition('take\u202Evaw.bat')).utf8).toBe('takevaw.wav');
    expect(names(contentDisposition('\u2066mix\u2069\u200F.wav')).utf8).toBe('mix.wav');
  });

  it('drops half of an emoji cut off at the end of a name', () => {
    expect(names(contentDisposition('Applause \uD83D')).utf8).toBe('Applause.wav');
  });

  it('drops control characters, so no header can be split or injected', () => {
    const header = contentDisposition('take\r\nSet-Cookie: a=b\u0000\u0007.wav');
    // eslint-disable-next-line no-control-regex -- the check looks for control characters
    expect(header).not.toMatch(/[\u0000-\u001f\u007f]/);
    expect(names(header).utf8).toBe('takeSet-Cookie: a=b.wav');
  });

  it('never lets a quote or backslash close the quoted fallback', () => {
    const header = contentDisposition('say "hello" now.wav');
    const { ascii, utf8 } = names(header);
    expect(ascii).toBe('say _hello_ now.wav');
    expect(utf8).toBe('say "hello" now.wav');
    expect(header.match(/"/g)).toHaveLength(2);
  });

  it('spells non-ASCII names exactly in filename* and with underscores in the fallback', () => {
    const { ascii, utf8 } = names(contentDisposition('Szene 4 – Tür zu 🚪.wav'));
    expect(utf8).toBe('Szene 4 – Tür zu 🚪.wav');
    expect(ascii).toMatch(/^[\x20-\x7e]+$/);
    expect(ascii).toBe('Szene 4 _ T_r zu _.wav');
  });

  it('percent-encodes the characters RFC 5987 does not allow bare', () => {
    const header = contentDisposition("it's (100%) *done*.wav");
    expect(header).toContain("filename*=UTF-8''it%27s%20%28100%25%29%20%2Adone%2A.wav");
    expect(names(header).ascii).toBe("it's (100_) *done*.wav");
  });

  it('caps a 500-character name, keeping the extension', () => {
    const long = `${'x'.repeat(500)}.wav`;
    const name = safeFileName(long);
    expect(name.length).toBeLessThanOrEqual(180);
    expect(name.endsWith('.wav')).toBe(true);
    const header = contentDisposition(long);
    expect(names(header).utf8).toBe(name);
    expect(header.length).toBeLessThan(500);
  });

  it('falls back to a generic name when nothing is left', () => {
    expect(safeFileName('\u0000\u0001')).toBe('take.wav');
    expect(safeFileName('   ')).toBe('take.wav');
  });
});
