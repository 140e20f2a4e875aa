/**
 * A corpus of damaged and hostile WAV files, made by code: every way a header can be
 * cut short or lie, impossible formats, misplaced chunks and plain noise.
 */
import { seededRandom } from './testSignals';

interface Chunk {
  id: string;
  body: Buffer;
  /** Size to write in the chunk header instead of the body's real length. */
  declaredSize?: number;
}

function chunk(c: Chunk): Buffer {
  const header = Buffer.alloc(8);
  header.write(c.id, 0, 'latin1');
  header.writeUInt32LE(c.declaredSize ?? c.body.length, 4);
  const pad = c.body.length % 2 ? Buffer.alloc(1) : Buffer.alloc(0);
  return Buffer.concat([header, c.body, pad]);
}

function riff(chunks: Buffer[], { magic = 'RIFF', form = 'WAVE', declaredSize }: { magic?: string; form?: string; declaredSize?: number } = {}): Buffer {
  const body = Buffer.concat([Buffer.from(form, 'latin1'), ...chunks]);
  const header = Buffer.alloc(8);
  header.write(magic, 0, 'latin1');
  header.writeUInt32LE(declaredSize ?? body.length, 4);
  return Buffer.concat([header, body]);
}

function fmt({ tag = 1, channels = 2, rate = 48000, bits = 24, blockAlign, byteRate }: { tag?: number; channels?: number; rate?: number; bits?: number; blockAlign?: number; byteRate?: number } = {}): Buffer {
  const b = Buffer.alloc(16);
  const align = blockAlign ?? Math.max(1, Math.ceil((channels * bits) / 8));
  b.writeUInt16LE(tag, 0);
  b.writeUInt16LE(channels & 0xffff, 2);
  b.writeUInt32LE(rate >>> 0, 4);
  b.writeUInt32LE((byteRate ?? rate * align) >>> 0, 8);
  b.writeUInt16LE(align & 0xffff, 12);
  b.writeUInt16LE(bits & 0xffff, 14);
  return b;
}

function extensibleFmt(subFormatFirstBytes: number, validBits = 24): Buffer {
  const base = fmt({ tag: 0xfffe });
  const ext = Buffer.alloc(24);
  ext.writeUInt16LE(22, 0);
  ext.writeUInt16LE(validBits, 2);
  ext.writeUInt32LE(3, 4);
  ext.writeUInt16LE(subFormatFirstBytes, 8);
  // The rest of the KSDATAFORMAT GUID: 0000-0010-8000-00aa00389b71
  Buffer.from([0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71]).copy(ext, 10);
  return Buffer.concat([base, ext]);
}

function noiseBytes(n: number, seed: number): Buffer {
  const rand = seededRandom(seed);
  const out = Buffer.alloc(n);
  for (let i = 0; i < n; i++) out[i] = Math.floor(rand() * 256);
  return out;
}

/** 0.05 s of quiet 24-bit stereo audio. */
const AUDIO = Buffer.from(noiseBytes(2400 * 6, 7).map((b, i) => (i % 3 === 2 ? (b & 1 ? 0xff : 0x00) : b)));

export interface MalformedCase {
  name: string;
  bytes: Buffer;
}

export function malformedCorpus(): MalformedCase[] {
  const good = riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })]);
  const cases: MalformedCase[] = [];
  // A cut at every byte of the header, and a few inside the audio.
  for (let n = 0; n <= 44; n++) cases.push({ name: `truncated-at-${n}`, bytes: good.subarray(0, n) });
  for (const n of [45, 47, 100, 1001]) cases.push({ name: `truncated-in-audio-${n}`, bytes: good.subarray(0, n) });

  const withFmt = (f: Buffer, data: Buffer = AUDIO) => riff([chunk({ id: 'fmt ', body: f }), chunk({ id: 'data', body: data })]);
  cases.push(
    { name: 'riff-size-too-small', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })], { declaredSize: 4 }) },
    { name: 'riff-size-huge', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })], { declaredSize: 0xfffffff0 }) },
    { name: 'data-size-zero', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO, declaredSize: 0 })]) },
    { name: 'data-size-ffffffff', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO, declaredSize: 0xffffffff })]) },
    { name: 'data-size-past-end', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO, declaredSize: AUDIO.length * 10 })]) },
    { name: 'data-size-odd-partial-frame', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO.subarray(0, 1001) })]) },
    { name: 'fmt-size-zero', bytes: riff([chunk({ id: 'fmt ', body: Buffer.alloc(0) }), chunk({ id: 'data', body: AUDIO })]) },
    { name: 'fmt-size-8', bytes: riff([chunk({ id: 'fmt ', body: fmt().subarray(0, 8) }), chunk({ id: 'data', body: AUDIO })]) },
    { name: 'fmt-size-runs-off-end', bytes: riff([chunk({ id: 'fmt ', body: fmt(), declaredSize: 1 << 30 })]) },
    { name: 'unknown-chunk-runs-off-end', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'junk', body: Buffer.alloc(10), declaredSize: 1 << 30 })]) },
    { name: 'channels-zero', bytes: withFmt(fmt({ channels: 0, blockAlign: 6 })) },
    { name: 'channels-65535', bytes: withFmt(fmt({ channels: 65535, blockAlign: 65535 })) },
    { name: 'channels-300', bytes: withFmt(fmt({ channels: 300 })) },
    { name: 'rate-zero', bytes: withFmt(fmt({ rate: 0 })) },
    { name: 'rate-huge', bytes: withFmt(fmt({ rate: 0xffffffff })) },
    { name: 'rate-1hz', bytes: withFmt(fmt({ rate: 1 })) },
    { name: 'bits-zero', bytes: withFmt(fmt({ bits: 0, blockAlign: 6 })) },
    { name: 'bits-7', bytes: withFmt(fmt({ bits: 7 })) },
    { name: 'bits-13', bytes: withFmt(fmt({ bits: 13 })) },
    { name: 'bits-40', bytes: withFmt(fmt({ bits: 40 })) },
    { name: 'block-align-zero', bytes: withFmt(fmt({ blockAlign: 0 })) },
    { name: 'block-align-inconsistent', bytes: withFmt(fmt({ blockAlign: 7 })) },
    { name: 'adpcm', bytes: withFmt(fmt({ tag: 2, bits: 4 })) },
    { name: 'mpeg-layer3', bytes: withFmt(fmt({ tag: 0x55, bits: 0 })) },
    { name: 'float-24-bit', bytes: withFmt(fmt({ tag: 3, bits: 24 })) },
    { name: 'extensible-unknown-subformat', bytes: withFmt(extensibleFmt(0x0092)) },
    { name: 'extensible-valid-bits-over-container', bytes: withFmt(extensibleFmt(1, 40)) },
    { name: 'data-before-fmt', bytes: riff([chunk({ id: 'data', body: AUDIO }), chunk({ id: 'fmt ', body: fmt() })]) },
    { name: 'no-fmt', bytes: riff([chunk({ id: 'data', body: AUDIO })]) },
    { name: 'no-data', bytes: riff([chunk({ id: 'fmt ', body: fmt() })]) },
    { name: 'two-fmt-chunks', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'fmt ', body: fmt({ channels: 1 }) }), chunk({ id: 'data', body: AUDIO })]) },
    { name: 'nested-riff', bytes: riff([chunk({ id: 'RIFF', body: good }), chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })]) },
    { name: 'only-nested-riff', bytes: riff([chunk({ id: 'RIFF', body: good })]) },
    { name: 'not-wave-form', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })], { form: 'AVI ' }) },
    { name: 'rifx-big-endian', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })], { magic: 'RIFX' }) },
    { name: 'rf64-without-ds64', bytes: riff([chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO, declaredSize: 0xffffffff })], { magic: 'RF64', declaredSize: 0xffffffff }) },
    { name: 'rf64-ds64-too-short', bytes: riff([chunk({ id: 'ds64', body: Buffer.alloc(8) }), chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO, declaredSize: 0xffffffff })], { magic: 'RF64', declaredSize: 0xffffffff }) },
    { name: 'bext-too-short', bytes: riff([chunk({ id: 'bext', body: Buffer.alloc(10) }), chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })]) },
    { name: 'many-tiny-unknown-chunks', bytes: riff([...Array.from({ length: 2000 }, (_, i) => chunk({ id: `x${String(i % 100).padStart(3, '0')}`, body: Buffer.alloc(i % 3) })), chunk({ id: 'fmt ', body: fmt() }), chunk({ id: 'data', body: AUDIO })]) },
    { name: 'odd-sized-chunk-without-pad', bytes: Buffer.concat([riff([chunk({ id: 'fmt ', body: fmt() })]).subarray(0, 36), Buffer.from('LIST'), Buffer.from([3, 0, 0, 0]), Buffer.from('abc'), chunk({ id: 'data', body: AUDIO })]) },
  );
  for (let seed = 1; seed <= 12; seed++) {
    cases.push({ name: `random-after-header-${seed}`, bytes: Buffer.concat([good.subarray(0, 12), noiseBytes(200 + seed * 37, seed)]) });
    cases.push({ name: `random-bytes-${seed}`, bytes: noiseBytes(64 + seed * 50, seed + 100) });
  }
  return cases;
}
