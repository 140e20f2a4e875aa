import { describe, expect, it } from 'vitest';
import { csvField, csvRow } from '@/lib/reports/csv';
import { pdfText } from '@/lib/reports/pdf.server';

describe('CSV fields', () => {
  it('quotes commas, quotes and line breaks as RFC 4180 says', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a, b')).toBe('"a, b"');
    expect(csvField('say "retake"')).toBe('"say ""retake"""');
    expect(csvField('line one\nline two')).toBe('"line one\nline two"');
    expect(csvField(null)).toBe('');
    expect(csvRow(['x', 1.5, null, 'y,z'])).toBe('x,1.5,,"y,z"');
  });

  it('defuses text that a spreadsheet would run as a formula, but keeps measured numbers numeric', () => {
    for (const text of ['=SUM(A1)', '+1+1', '-2+3', '@cmd', '\tx', '\rx']) {
      expect(csvField(text).replace(/^"|"$/g, '').startsWith("'")).toBe(true);
    }
    expect(csvField('=HYPERLINK("http://x","y")')).toBe(`"'=HYPERLINK(""http://x"",""y"")"`);
    expect(csvField(-23.4)).toBe('-23.4');
    expect(csvField(Number.NaN)).toBe('');
  });
});

describe('PDF text', () => {
  it('keeps Windows-1252 text and spells out the rest instead of printing garbage', () => {
    expect(pdfText('Harbour Lights — episode 12, café “take” €')).toBe('Harbour Lights — episode 12, café “take” €');
    expect(pdfText('−16 LUFS ≤ −1 dBTP')).toBe('-16 LUFS <= -1 dBTP');
    expect(pdfText('Łódź Ångström')).toBe('Lódz Ångström');
    expect(pdfText('日本')).toBe('??');
    expect(pdfText('a\nb')).toBe('a b');
  });
});
