/**
 * Writes WAV files for tests and benchmarks: RIFF or RF64, PCM 8/16/24/32 or
 * float 32/64, plain or WAVE_FORMAT_EXTENSIBLE, with extra chunks and header
 * fields that can be set wrong on purpose.
 */

export type SampleCoding = 'pcm8' | 'pcm16' | 'pcm24' | 'pcm32' | 'float32' | 'float64';

export interface WavLayout {
  sampleRate: number;
  channels: number;
  coding: SampleCoding;
  /** Write WAVE_FORMAT_EXTENSIBLE with this channel mask. */
  extensibleMask?: number;
  /** Valid bits for WAVE_FORMAT_EXTENSIBLE (defaults to the container bits). */
  validBits?: number;
}

export interface Chunk {
  id: string;
  body: Buffer;
}

export const bitsOf = (coding: SampleCoding) => Number(coding.replace(/\D+/g, ''));
export const isFloat = (coding: SampleCoding) => coding.startsWith('float');
export const bytesPerFrame = (layout: WavLayout) => (bitsOf(layout.coding) / 8) * layout.channels;

function chunk(id: string, body: Buffer): Buffer {
  const header = Buffer.alloc(8);
  header.write(id, 0, 'latin1');
  header.writeUInt32LE(body.length, 4);
  return Buffer.concat([header, body, body.length % 2 ? Buffer.alloc(1) : Buffer.alloc(0)]);
}

/** The fmt chunk body for a layout (16 bytes plain PCM, 18 plain float, 40 extensible). */
export function fmtBody(layout: WavLayout): Buffer {
  const bits = bitsOf(layout.coding);
  const float = isFloat(layout.coding);
  const extensible = layout.extensibleMask !== undefined;
  const body = Buffer.alloc(extensible ? 40 : float ? 18 : 16);
  body.writeUInt16LE(extensible ? 0xfffe : float ? 3 : 1, 0);
  body.writeUInt16LE(layout.channels, 2);
  body.writeUInt32LE(layout.sampleRate, 4);
  body.writeUInt32LE(layout.sampleRate * bytesPerFrame(layout), 8);
  body.writeUInt16LE(bytesPerFrame(layout), 12);
  body.writeUInt16LE(bits, 14);
  if (extensible) {
    body.writeUInt16LE(22, 16);
    body.writeUInt16LE(layout.validBits ?? bits, 18);
    body.writeUInt32LE(layout.extensibleMask!, 20);
    // KSDATAFORMAT_SUBTYPE_PCM / _IEEE_FLOAT: {0000000X-0000-0010-8000-00AA00389B71}
    Buffer.from([float ? 3 : 1, 0, 0, 0, 0, 0, 0x10, 0, 0x80, 0, 0, 0xaa, 0, 0x38, 0x9b, 0x71]).copy(body, 24);
  }
  return body;
}

/** Interleaves and encodes frames [start, start+frames) of per-channel float signals (full scale 1.0). */
export function encodeSamples(channels: ArrayLike<number>[], coding: SampleCoding, start = 0, frames = channels[0].length - start): Buffer {
  const bytes = bitsOf(coding) / 8;
  const count = channels.length;
  const out = Buffer.alloc(frames * count * bytes);
  const bits = bitsOf(coding);
  const scale = 2 ** (bits - 1);
  const max = scale - 1;
  let offset = 0;
  for (let i = start; i < start + frames; i++) {
    for (let c = 0; c < count; c++) {
      const x = channels[c][i];
      if (coding === 'float32') out.writeFloatLE(x, offset);
      else if (coding === 'float64') out.writeDoubleLE(x, offset);
      else {
        const code = Math.max(-scale, Math.min(max, Math.round(x * scale)));
        if (bits === 8) out[offset] = code + 128;
        else if (bits === 16) out.writeInt16LE(code, offset);
        else if (bits === 24) out.writeIntLE(code, offset, 3);
        else out.writeInt32LE(code, offset);
      }
      offset += bytes;
    }
  }
  return out;
}

export interface WavFileOptions {
  /** Chunks written before fmt, between fmt and data, and after data. */
  chunksBeforeFmt?: Chunk[];
  chunksBeforeData?: Chunk[];
  chunksAfterData?: Chunk[];
  /** Put the data chunk before the fmt chunk. */
  dataBeforeFmt?: boolean;
  /** Leave out the fmt chunk. */
  omitFmt?: boolean;
  /** Write this value in the data size field instead of the true size. */
  dataSizeField?: number;
  /** Write this value in the RIFF size field instead of the true size. */
  riffSizeField?: number;
  /** RF64 container with a ds64 chunk. */
  rf64?: boolean;
}

/** A complete WAV file in memory (small fixtures only). */
export function wavFile(layout: WavLayout, audio: Buffer, options: WavFileOptions = {}): Buffer {
  const fmt = options.omitFmt ? Buffer.alloc(0) : chunk('fmt ', fmtBody(layout));
  const dataHeader = Buffer.alloc(8);
  dataHeader.write('data', 0, 'latin1');
  dataHeader.writeUInt32LE(options.rf64 ? 0xffffffff : (options.dataSizeField ?? audio.length), 4);
  const data = Buffer.concat([dataHeader, audio, audio.length % 2 ? Buffer.alloc(1) : Buffer.alloc(0)]);
  const before = Buffer.concat((options.chunksBeforeFmt ?? []).map((c) => chunk(c.id, c.body)));
  const middle = Buffer.concat((options.chunksBeforeData ?? []).map((c) => chunk(c.id, c.body)));
  const after = Buffer.concat((options.chunksAfterData ?? []).map((c) => chunk(c.id, c.body)));
  const ordered = options.dataBeforeFmt ? [before, data, middle, fmt] : [before, fmt, middle, data];
  const ds64 = options.rf64 ? chunk('ds64', ds64Body(0, audio.length, audio.length / bytesPerFrame(layout))) : Buffer.alloc(0);
  const body = Buffer.concat([Buffer.from('WAVE', 'latin1'), ds64, ...ordered, after]);
  const header = Buffer.alloc(8);
  header.write(options.rf64 ? 'RF64' : 'RIFF', 0, 'latin1');
  header.writeUInt32LE(options.rf64 ? 0xffffffff : (options.riffSizeField ?? body.length), 4);
  const file = Buffer.concat([header, body]);
  if (options.rf64) file.writeUInt32LE(file.length - 8, 20); // riffSizeLow (file < 4 GiB here)
  return file;
}

/** ds64 body: riff, data and sample-count sizes as 64-bit values, empty table (EBU Tech 3306). */
export function ds64Body(riffBytes: number, dataBytes: number, sampleCount: number): Buffer {
  const body = Buffer.alloc(28);
  const write64 = (value: number, offset: number) => {
    body.writeUInt32LE(value % 2 ** 32, offset);
    body.writeUInt32LE(Math.floor(value / 2 ** 32), offset + 4);
  };
  write64(riffBytes, 0);
  write64(dataBytes, 8);
  write64(sampleCount, 16);
  return body;
}

/**
 * Header of a streamed file, up to and including the data chunk header, for
 * `dataBytes` of audio (RF64 with ds64 when `rf64` or when the audio passes 4 GiB).
 */
export function streamingHeader(layout: WavLayout, dataBytes: number, rf64 = dataBytes >= 2 ** 32 - 64): Buffer {
  const fmt = chunk('fmt ', fmtBody(layout));
  const ds64Length = rf64 ? 8 + 28 : 0;
  const headerBytes = 12 + ds64Length + fmt.length + 8;
  const riffBytes = headerBytes - 8 + dataBytes + (dataBytes % 2);
  const header = Buffer.alloc(12);
  header.write(rf64 ? 'RF64' : 'RIFF', 0, 'latin1');
  header.writeUInt32LE(rf64 ? 0xffffffff : riffBytes, 4);
  header.write('WAVE', 8, 'latin1');
  const ds64 = rf64 ? chunk('ds64', ds64Body(riffBytes, dataBytes, dataBytes / bytesPerFrame(layout))) : Buffer.alloc(0);
  const dataHeader = Buffer.alloc(8);
  dataHeader.write('data', 0, 'latin1');
  dataHeader.writeUInt32LE(rf64 ? 0xffffffff : dataBytes, 4);
  return Buffer.concat([header, ds64, fmt, dataHeader]);
}

/** A bext chunk body with the given fields (EBU Tech 3285 v2 offsets). */
export function bextBody(fields: {
  description?: string; originator?: string; originatorReference?: string; originationDate?: string; originationTime?: string;
  timeReference?: number; codingHistory?: string; loudnessValue?: number;
}): Buffer {
  const history = Buffer.from(fields.codingHistory ?? '', 'latin1');
  const body = Buffer.alloc(602 + history.length);
  body.write(fields.description ?? '', 0, 256, 'latin1');
  body.write(fields.originator ?? '', 256, 32, 'latin1');
  body.write(fields.originatorReference ?? '', 288, 32, 'latin1');
  body.write(fields.originationDate ?? '', 320, 10, 'latin1');
  body.write(fields.originationTime ?? '', 330, 8, 'latin1');
  const reference = fields.timeReference ?? 0;
  body.writeUInt32LE(reference % 2 ** 32, 338);
  body.writeUInt32LE(Math.floor(reference / 2 ** 32), 342);
  body.writeUInt16LE(2, 346);
  body.writeInt16LE(fields.loudnessValue ?? 0x7fff, 412);
  history.copy(body, 602);
  return body;
}
