import type { Encoding } from '../types';
import { UnreadableWavError } from './UnreadableWavError';

/** Upper bounds past which a header is taken as corrupt rather than exotic. */
export const MAX_CHANNELS = 64;
export const MIN_SAMPLE_RATE_HZ = 1000;
export const MAX_SAMPLE_RATE_HZ = 768_000;

const FORMAT_PCM = 0x0001;
const FORMAT_IEEE_FLOAT = 0x0003;
const FORMAT_EXTENSIBLE = 0xfffe;
/** Bytes 2..15 of every KSDATAFORMAT_SUBTYPE GUID (Microsoft WAVEFORMATEXTENSIBLE docs). */
const KSDATAFORMAT_GUID_TAIL = Buffer.from([0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71]);

/** Format names for the codes a producer might meet (RFC 2361 registry). */
const KNOWN_FORMAT_NAMES: Record<number, string> = {
  0x0002: 'ADPCM',
  0x0006: 'A-law',
  0x0007: 'mu-law',
  0x0011: 'IMA ADPCM',
  0x0050: 'MPEG',
  0x0055: 'MP3',
  0x2000: 'AC-3',
};

export interface FmtInfo {
  encoding: Encoding;
  channels: number;
  sampleRate: number;
  /** Container bits per sample (8, 16, 24, 32 or 64). */
  bitsPerSample: number;
  validBitsPerSample: number;
  blockAlign: number;
  channelMask: number | null;
  /** Things worth telling the producer that did not stop the read. */
  issues: string[];
}

function describeFormatCode(code: number): string {
  const hex = `0x${code.toString(16).padStart(4, '0')}`;
  return KNOWN_FORMAT_NAMES[code] ? `${KNOWN_FORMAT_NAMES[code]} (${hex})` : `format code ${hex}`;
}

/**
 * Parses the body of a `fmt ` chunk (WAVEFORMAT, WAVEFORMATEX or WAVEFORMATEXTENSIBLE).
 * @throws UnreadableWavError for anything that cannot be decoded as PCM or IEEE float.
 */
export function parseFmtChunk(body: Buffer): FmtInfo {
  if (body.length < 16) {
    throw new UnreadableWavError('bad-fmt', `The fmt chunk is ${body.length} bytes long; at least 16 are needed.`);
  }
  const issues: string[] = [];
  let formatCode = body.readUInt16LE(0);
  const channels = body.readUInt16LE(2);
  const sampleRate = body.readUInt32LE(4);
  const declaredBlockAlign = body.readUInt16LE(12);
  const declaredBits = body.readUInt16LE(14);
  let validBits = declaredBits;
  let channelMask: number | null = null;

  if (formatCode === FORMAT_EXTENSIBLE) {
    const extensionSize = body.length >= 18 ? body.readUInt16LE(16) : 0;
    if (body.length < 40 || extensionSize < 22) {
      throw new UnreadableWavError('bad-fmt', 'The fmt chunk says WAVE_FORMAT_EXTENSIBLE but its extension is shorter than 22 bytes.');
    }
    validBits = body.readUInt16LE(18) || declaredBits;
    channelMask = body.readUInt32LE(20);
    const subFormat = body.subarray(24, 40);
    if (!subFormat.subarray(2).equals(KSDATAFORMAT_GUID_TAIL)) {
      throw new UnreadableWavError('unsupported-encoding', 'The audio uses an extensible sub-format Takeproof does not decode (only PCM and IEEE float are supported).');
    }
    // For EXTENSIBLE the SubFormat, not wFormatTag, decides PCM vs float (Microsoft WAVEFORMATEXTENSIBLE docs).
    formatCode = subFormat.readUInt16LE(0);
  }

  if (formatCode !== FORMAT_PCM && formatCode !== FORMAT_IEEE_FLOAT) {
    throw new UnreadableWavError('unsupported-encoding', `The audio is ${describeFormatCode(formatCode)}; Takeproof reads only linear PCM and IEEE float WAV.`);
  }
  if (channels === 0) throw new UnreadableWavError('bad-fmt', 'The header declares zero channels.');
  if (channels > MAX_CHANNELS) throw new UnreadableWavError('bad-fmt', `The header declares ${channels} channels; Takeproof reads at most ${MAX_CHANNELS}.`);
  if (sampleRate === 0) throw new UnreadableWavError('bad-fmt', 'The header declares a sample rate of 0 Hz.');
  if (sampleRate < MIN_SAMPLE_RATE_HZ || sampleRate > MAX_SAMPLE_RATE_HZ) {
    throw new UnreadableWavError('bad-fmt', `The header declares a sample rate of ${sampleRate} Hz, outside ${MIN_SAMPLE_RATE_HZ}-${MAX_SAMPLE_RATE_HZ} Hz.`);
  }
  if (declaredBits === 0) throw new UnreadableWavError('bad-fmt', 'The header declares 0 bits per sample.');

  const encoding: Encoding = formatCode === FORMAT_IEEE_FLOAT ? 'float' : 'pcm';
  // Bytes per sample are rounded up first (EBU Tech 3285 appendix: nBlockAlign = nChannels * ceil(bits/8)).
  const containerBits = Math.ceil(declaredBits / 8) * 8;
  const supported = encoding === 'float' ? containerBits === 32 || containerBits === 64 : containerBits >= 8 && containerBits <= 32;
  if (!supported) {
    throw new UnreadableWavError('unsupported-encoding', `${declaredBits}-bit ${encoding === 'float' ? 'float' : 'integer PCM'} is not a sample format Takeproof decodes.`);
  }
  if (validBits > containerBits) {
    throw new UnreadableWavError('bad-fmt', `The header declares ${validBits} valid bits in a ${containerBits}-bit sample.`);
  }
  const blockAlign = channels * (containerBits / 8);
  if (declaredBlockAlign !== blockAlign) {
    issues.push(`The header's block alignment (${declaredBlockAlign} bytes) does not match ${channels} channels of ${containerBits}-bit samples; ${blockAlign} bytes per frame were assumed.`);
  }
  return { encoding, channels, sampleRate, bitsPerSample: containerBits, validBitsPerSample: validBits, blockAlign, channelMask, issues };
}
