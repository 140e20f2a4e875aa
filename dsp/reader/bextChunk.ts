import type { BextInfo } from '../types';

/** Size of the fixed part of the Broadcast Wave `bext` chunk before CodingHistory (EBU Tech 3285 v2). */
export const BEXT_FIXED_BYTES = 602;

/** Reads a fixed-size CHAR field: stops at the first NUL, trims trailing spaces. */
function readText(body: Buffer, offset: number, length: number): string {
  const end = Math.min(body.length, offset + length);
  if (offset >= end) return '';
  const field = body.subarray(offset, end);
  const nul = field.indexOf(0);
  return field.subarray(0, nul === -1 ? field.length : nul).toString('latin1').trimEnd();
}

/**
 * Parses a `bext` chunk body (EBU Tech 3285 v2 field offsets; strings are ASCII,
 * read as Latin-1 so no byte is lost). A body shorter than the fixed part yields
 * empty fields for what is missing.
 */
export function parseBextChunk(body: Buffer): BextInfo {
  // TimeReference is a 64-bit sample count split into low and high DWORDs at offsets 338 and 342.
  const timeReference = body.length >= 346 ? body.readUInt32LE(338) + body.readUInt32LE(342) * 2 ** 32 : 0;
  return {
    description: readText(body, 0, 256),
    originator: readText(body, 256, 32),
    originatorReference: readText(body, 288, 32),
    originationDate: readText(body, 320, 10),
    originationTime: readText(body, 330, 8),
    timeReference,
    codingHistory: readText(body, BEXT_FIXED_BYTES, Math.max(0, body.length - BEXT_FIXED_BYTES)).replace(/[\r\n]+$/, ''),
  };
}
