import type { Readable } from 'node:stream';
import type { AudioFormat, BextInfo, Container, SampleBlock } from '../types';
import { parseBextChunk } from './bextChunk';
import { ByteSource } from './byteSource';
import { parseDs64Chunk, type Ds64Sizes } from './ds64Chunk';
import { parseFmtChunk, type FmtInfo } from './fmtChunk';
import { SampleDecoder } from './sampleDecoder';
import { UnreadableWavError } from './UnreadableWavError';

/** Frames per decoded block: large enough to amortise per-block work, small enough to stay in cache. */
export const DEFAULT_BLOCK_FRAMES = 65536;
/** Cap on one block's interleaved bytes, so 64-channel files do not need huge buffers. */
const MAX_BLOCK_BYTES = 4 * 1024 * 1024;
/** Largest metadata chunk read into memory; bigger ones are skipped with a note. */
const MAX_METADATA_BYTES = 16 * 1024 * 1024;
const MAX_FMT_BYTES = 4096;
/** 32-bit size fields holding this value defer to the ds64 chunk (EBU Tech 3306). */
const SIZE_IN_DS64 = 0xffffffff;

/** Metadata found around the audio. Chunks after the audio are added while the blocks are read. */
export interface WavMetadata {
  bext: BextInfo | null;
  ixml: string | null;
  /** Header problems that did not stop the analysis, in plain words. */
  headerIssues: string[];
}

export interface OpenedWav {
  format: AudioFormat;
  metadata: WavMetadata;
  /**
   * Yields the audio in blocks of up to `blockFrames` frames. The block's
   * arrays are reused for the next block: copy what you keep.
   */
  blocks(): AsyncGenerator<SampleBlock, void, void>;
  /** Frames decoded so far (all of them once `blocks()` is exhausted). */
  framesRead(): number;
  /** Bytes of the file consumed so far (header included). */
  bytesRead(): number;
  /** Float samples that were NaN or ±Inf (decoded as 0), per channel, and the first frame holding one. */
  nonFiniteSamples(): NonFiniteSamples;
}

export interface NonFiniteSamples {
  perChannel: number[];
  firstFrame: number | null;
}

export interface OpenWavOptions {
  /** Frames per block, default 65536. */
  blockFrames?: number;
  /**
   * Opens the same file again from a byte offset. Only needed for the rare file
   * whose audio comes before its `fmt ` chunk; without it such a stream is refused.
   */
  reopenAt?: (byteOffset: number) => Readable;
}

/** Chunk id as printable text for messages. */
function printableId(id: string): string {
  return /^[\x20-\x7e]{4}$/.test(id) ? `'${id}'` : `0x${Buffer.from(id, 'latin1').toString('hex')}`;
}

function formatBytes(bytes: number): string {
  if (bytes >= 1024 ** 3) return `${(bytes / 1024 ** 3).toFixed(2)} GiB`;
  if (bytes >= 1024 ** 2) return `${(bytes / 1024 ** 2).toFixed(1)} MiB`;
  return `${bytes} bytes`;
}

interface DataChunkPlan {
  /** Byte offset of the first audio byte. */
  offset: number;
  /** Audio bytes the header declares, or null when the size field holds no usable value. */
  declaredBytes: number | null;
}

/**
 * Reads a RIFF/WAVE or RF64 header from a stream and prepares block-wise
 * decoding of its audio. Chunks may come in any order; unknown chunks are
 * skipped; odd-sized chunks are followed by a pad byte (RIFF spec).
 * @throws UnreadableWavError when the stream cannot be analysed.
 */
export async function openWav(readable: Readable, options: OpenWavOptions = {}): Promise<OpenedWav> {
  let source = new ByteSource(readable);
  const metadata: WavMetadata = { bext: null, ixml: null, headerIssues: [] };
  const issues = metadata.headerIssues;

  const riffHeader = await source.read(12);
  if (riffHeader.length === 0) throw new UnreadableWavError('truncated-header', 'The file is empty.');
  const magic = riffHeader.toString('latin1', 0, 4);
  if (magic !== 'RIFF' && magic !== 'RF64' && magic !== 'BW64') {
    throw new UnreadableWavError('not-wav', 'This is not a WAV file: it does not start with a RIFF or RF64 header.');
  }
  if (riffHeader.length < 12) throw new UnreadableWavError('truncated-header', 'The file ends inside its RIFF header.');
  if (riffHeader.toString('latin1', 8, 12) !== 'WAVE') {
    throw new UnreadableWavError('not-wav', 'This RIFF file is not a WAVE file.');
  }
  const container: Container = magic === 'RIFF' ? 'RIFF' : 'RF64';
  const riffSizeField = riffHeader.readUInt32LE(4);
  let ds64: Ds64Sizes | null = null;
  let fmt: FmtInfo | null = null;
  let data: DataChunkPlan | null = null;
  /** Audio found before the fmt chunk, to be re-read from the file once the format is known. */
  let dataBeforeFmt: DataChunkPlan | null = null;

  const readBody = async (id: string, size: number): Promise<Buffer> => {
    const body = await source.read(size);
    if (body.length < size) {
      throw new UnreadableWavError('truncated-header', `The file ends inside its ${printableId(id)} chunk, before any audio.`);
    }
    if (size % 2 === 1) await source.skip(1);
    return body;
  };

  const handleMetadataChunk = async (id: string, size: number, beforeAudio: boolean): Promise<boolean> => {
    if (id !== 'bext' && id !== 'iXML') return false;
    if (size > MAX_METADATA_BYTES) {
      issues.push(`The ${id} chunk is ${formatBytes(size)}, too large to be real metadata; it was ignored.`);
      return false;
    }
    const body = beforeAudio ? await readBody(id, size) : await source.read(size);
    if (!beforeAudio && body.length < size) {
      issues.push(`The ${id} chunk after the audio is cut short; it was ignored.`);
      return true;
    }
    if (!beforeAudio && size % 2 === 1) await source.skip(1);
    if (id === 'bext') metadata.bext = parseBextChunk(body);
    else metadata.ixml = body.toString('utf8').replace(/\0+$/, '');
    return true;
  };

  // Walk the chunks up to the audio.
  for (;;) {
    const chunkHeader = await source.read(8);
    if (chunkHeader.length < 8) {
      if (!fmt) throw new UnreadableWavError('no-fmt', 'The file has no fmt chunk, so its audio format is unknown.');
      if (dataBeforeFmt) break;
      throw new UnreadableWavError('no-data', 'The file has a format chunk but no audio (no data chunk).');
    }
    const id = chunkHeader.toString('latin1', 0, 4);
    const sizeField = chunkHeader.readUInt32LE(4);
    let size = sizeField;
    if (sizeField === SIZE_IN_DS64 && ds64) size = id === 'data' ? ds64.dataBytes : (ds64.chunkBytes.get(id) ?? sizeField);

    if (id === 'ds64') {
      ds64 = parseDs64Chunk(await readBody(id, size));
      if (!ds64) issues.push('The RF64 ds64 chunk is shorter than 28 bytes; its sizes were ignored.');
      continue;
    }
    if (id === 'fmt ') {
      if (size > MAX_FMT_BYTES) throw new UnreadableWavError('bad-fmt', `The fmt chunk claims ${size} bytes, far more than any format needs.`);
      fmt = parseFmtChunk(await readBody(id, size));
      issues.push(...fmt.issues);
      if (dataBeforeFmt) break;
      continue;
    }
    if (id === 'data') {
      const declaredBytes = size === 0 || size === SIZE_IN_DS64 ? null : size;
      const plan: DataChunkPlan = { offset: source.position, declaredBytes };
      if (fmt) {
        data = plan;
        break;
      }
      if (declaredBytes === null) throw new UnreadableWavError('data-before-fmt', 'The audio comes before the fmt chunk and its length is not recorded, so the format cannot be found.');
      const skipped = await source.skip(declaredBytes + (declaredBytes % 2));
      if (skipped < declaredBytes) throw new UnreadableWavError('no-fmt', 'The file has no fmt chunk, so its audio format is unknown.');
      dataBeforeFmt = plan;
      continue;
    }
    if (await handleMetadataChunk(id, size, true)) continue;
    const skipped = await source.skip(size + (size % 2));
    if (skipped < size) {
      throw new UnreadableWavError('chunk-overrun', `The ${printableId(id)} chunk claims ${formatBytes(size)}, running past the end of the file before any audio.`);
    }
  }

  if (!fmt) throw new UnreadableWavError('no-fmt', 'The file has no fmt chunk, so its audio format is unknown.');
  if (dataBeforeFmt) {
    if (!options.reopenAt) {
      throw new UnreadableWavError('data-before-fmt', 'The audio comes before the fmt chunk; such a file can be read from disk but not from a stream.');
    }
    await source.close();
    source = new ByteSource(options.reopenAt(dataBeforeFmt.offset), dataBeforeFmt.offset);
    data = dataBeforeFmt;
    issues.push('The audio comes before the fmt chunk, against the RIFF rule that the format comes first; some players will refuse the file.');
  }
  const plan = data!;
  const format: AudioFormat = {
    container,
    encoding: fmt.encoding,
    sampleRate: fmt.sampleRate,
    bitsPerSample: fmt.bitsPerSample,
    validBitsPerSample: fmt.validBitsPerSample,
    channels: fmt.channels,
    blockAlign: fmt.blockAlign,
    dataOffset: plan.offset,
    declaredDataBytes: plan.declaredBytes,
    channelMask: fmt.channelMask,
  };
  // With the data size also missing, the data-size note below says it all.
  if (container === 'RIFF' && plan.declaredBytes !== null && (riffSizeField === 0 || riffSizeField === SIZE_IN_DS64)) {
    issues.push('The RIFF size field was never filled in, as happens when a recording is not closed properly.');
  }
  if (container === 'RF64' && !ds64) issues.push('The file is marked RF64 but has no ds64 chunk with the 64-bit sizes.');

  const blockFrames = Math.max(1, Math.min(options.blockFrames ?? DEFAULT_BLOCK_FRAMES, Math.floor(MAX_BLOCK_BYTES / format.blockAlign)));
  const decoder = new SampleDecoder(format.encoding, format.bitsPerSample, format.channels);
  let framesDecoded = 0;
  let firstNonFiniteFrame: number | null = null;
  let audioCutShort = false;
  const audioSource = source;
  const fromStream = !dataBeforeFmt;

  async function* blocks(): AsyncGenerator<SampleBlock, void, void> {
    // An ArrayBuffer of its own keeps the typed-array views 8-byte aligned.
    const interleaved = new Uint8Array(new ArrayBuffer(blockFrames * format.blockAlign));
    const channelData = Array.from({ length: format.channels }, () => new Float64Array(blockFrames));
    const block: SampleBlock = { channels: channelData, frames: 0, startFrame: 0 };
    let bytesLeft = plan.declaredBytes ?? Number.POSITIVE_INFINITY;
    let audioBytes = 0;
    let endOfFile = false;
    try {
      while (bytesLeft > 0 && !endOfFile) {
        const wanted = Math.min(interleaved.length, bytesLeft);
        const got = await audioSource.readInto(interleaved, 0, wanted);
        if (got < wanted) endOfFile = true;
        audioBytes += got;
        bytesLeft -= got;
        const frames = Math.floor(got / format.blockAlign);
        if (got % format.blockAlign !== 0) {
          issues.push(`The audio ends with a partial frame (${got % format.blockAlign} bytes), which was ignored.`);
        }
        if (frames === 0) continue;
        const nonFiniteAt = decoder.decode(interleaved, frames, channelData);
        if (nonFiniteAt >= 0 && firstNonFiniteFrame === null) firstNonFiniteFrame = framesDecoded + nonFiniteAt;
        block.frames = frames;
        block.startFrame = framesDecoded;
        framesDecoded += frames;
        yield block;
      }
      if (plan.declaredBytes === null && audioBytes === 0) {
        issues.push('The data chunk is empty: the file holds no audio.');
      } else if (plan.declaredBytes === null) {
        issues.push(`The header does not record the audio's length (data size ${ds64 || container === 'RF64' ? 'missing' : 'is 0 or 0xFFFFFFFF'}), as a recorder leaves it when it stops without closing the file; the ${formatBytes(audioBytes)} present were analysed.`);
      } else if (audioBytes < plan.declaredBytes) {
        audioCutShort = true;
        issues.push(`The header declares ${formatBytes(plan.declaredBytes)} of audio but the file holds only ${formatBytes(audioBytes)}: it was probably cut short. The audio present was analysed.`);
      } else if (fromStream) {
        await readTrailingChunks(plan.declaredBytes);
      }
      if (fromStream) checkRiffSize(audioSource.position);
    } finally {
      await audioSource.close();
    }
  }

  /** Reads metadata chunks that follow the audio (bext and iXML are often written last). */
  async function readTrailingChunks(declaredBytes: number): Promise<void> {
    if (declaredBytes % 2 === 1) await source.skip(1);
    // Bytes past the end the RIFF header declares are not chunks; checkRiffSize reports them.
    const declaredEnd = declaredFileBytes();
    const chunksEnd = declaredEnd ?? Number.POSITIVE_INFINITY;
    while (source.position < chunksEnd) {
      const chunkHeader = await source.read(8);
      if (chunkHeader.length === 0) return;
      if (chunkHeader.length < 8) {
        issues.push('The file ends with a few stray bytes after the audio.');
        return;
      }
      const id = chunkHeader.toString('latin1', 0, 4);
      let size = chunkHeader.readUInt32LE(4);
      if (size === SIZE_IN_DS64 && ds64?.chunkBytes.has(id)) size = ds64.chunkBytes.get(id)!;
      if (await handleMetadataChunk(id, size, false)) continue;
      const skipped = await source.skip(size + (size % 2));
      if (skipped < size) {
        issues.push(`The ${printableId(id)} chunk after the audio runs past the end of the file.`);
        return;
      }
    }
    // Drain what follows the declared end so its length can be reported.
    await source.skip(Number.POSITIVE_INFINITY);
  }

  /** File length the RIFF (or ds64) size declares, or null when the field holds no usable value. */
  function declaredFileBytes(): number | null {
    if (riffSizeField === 0 || (container === 'RIFF' && riffSizeField === SIZE_IN_DS64)) return null;
    if (container === 'RIFF') return riffSizeField + 8;
    return ds64 && ds64.riffBytes > 0 ? ds64.riffBytes + 8 : null;
  }

  function checkRiffSize(fileBytes: number): void {
    const declared = declaredFileBytes();
    // With the data size unknown or already reported short, the RIFF size adds nothing new.
    if (plan.declaredBytes === null || audioCutShort || declared === null) return;
    if (declared > fileBytes + 1) {
      issues.push(`The header says the file is ${formatBytes(declared)} but it is ${formatBytes(fileBytes)}: it was probably cut short.`);
    } else if (declared < fileBytes) {
      issues.push(`The file has ${formatBytes(fileBytes - declared)} after the end its header declares.`);
    }
  }

  return {
    format,
    metadata,
    blocks,
    framesRead: () => framesDecoded,
    bytesRead: () => source.position,
    nonFiniteSamples: () => ({ perChannel: [...decoder.nonFiniteSamples], firstFrame: firstNonFiniteFrame }),
  };
}
