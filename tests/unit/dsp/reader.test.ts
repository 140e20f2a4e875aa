import wavefile from 'wavefile';
import { describe, expect, it } from 'vitest';
import { UnreadableWavError } from '../../../dsp/reader/UnreadableWavError';
import { openWav } from '../../../dsp/reader/wavReader';
import { seededRandom } from '../../support/testSignals';
import { bufferStream, decodeWav } from '../../support/wavStreams';
import { bextBody, encodeSamples, fmtBody, wavFile, type SampleCoding, type WavLayout } from '../../support/wavWriter';

const { WaveFile } = wavefile;
const RATE = 48000;

function testChannels(channels: number, frames: number, seed = 1): Float64Array[] {
  const random = seededRandom(seed);
  return Array.from({ length: channels }, () => new Float64Array(frames).map(() => 1.8 * random() - 0.9));
}

describe('decoding, checked against the wavefile library as an independent decoder', () => {
  const codings: SampleCoding[] = ['pcm8', 'pcm16', 'pcm24', 'pcm32', 'float32', 'float64'];
  it.each(codings)('%s stereo, plain (against wavefile) and WAVE_FORMAT_EXTENSIBLE (against plain)', async (coding) => {
    const samples = encodeSamples(testChannels(2, 3001), coding);
    const extensible = await decodeWav(wavFile({ sampleRate: RATE, channels: 2, coding, extensibleMask: 0x3 }, samples), 7);
    {
      const layout: WavLayout = { sampleRate: RATE, channels: 2, coding };
      const file = wavFile(layout, samples);
      const ours = await decodeWav(file, 7);
      const reference = new WaveFile(file).getSamples(false, Float64Array) as unknown as Float64Array[];
      const bits = Number(coding.replace(/\D+/g, ''));
      const toFullScale = (value: number) => (coding.startsWith('float') ? value : bits === 8 ? (value - 128) / 128 : value / 2 ** (bits - 1));
      expect(ours.frames).toBe(3001);
      expect(ours.format.encoding).toBe(coding.startsWith('float') ? 'float' : 'pcm');
      expect(ours.format.bitsPerSample).toBe(bits);
      for (let c = 0; c < 2; c++) {
        for (let i = 0; i < 3001; i++) {
          if (ours.channels[c][i] !== toFullScale(reference[c][i])) throw new Error(`${coding} channel ${c} frame ${i}: ${ours.channels[c][i]} vs ${toFullScale(reference[c][i])}`);
        }
      }
      expect(extensible.channels).toEqual(ours.channels);
      expect(extensible.format.channelMask).toBe(3);
    }
  });
});

describe('chunk handling (RIFF: any order after fmt, unknown chunks skipped, odd sizes padded)', () => {
  const layout: WavLayout = { sampleRate: RATE, channels: 1, coding: 'pcm16' };
  const audio = encodeSamples(testChannels(1, 1001), 'pcm16');

  it('skips unknown and odd-sized chunks before fmt, between fmt and data, and after data', async () => {
    const file = wavFile(layout, audio, {
      chunksBeforeFmt: [{ id: 'LIST', body: Buffer.from('INFOISFT\x05\x00\x00\x00test\x00\x00') }, { id: 'odd ', body: Buffer.from([1, 2, 3]) }],
      chunksBeforeData: [{ id: 'JUNK', body: Buffer.alloc(28) }, { id: 'xyz1', body: Buffer.from([9]) }],
      chunksAfterData: [{ id: 'cue ', body: Buffer.alloc(4) }],
    });
    const decoded = await decodeWav(file, 5);
    expect(decoded.frames).toBe(1001);
    expect(decoded.metadata.headerIssues).toEqual([]);
  });

  it('reads an odd-sized data chunk (8-bit mono, odd frame count) and its pad byte', async () => {
    const odd = encodeSamples(testChannels(1, 1001), 'pcm8');
    const file = wavFile({ sampleRate: RATE, channels: 1, coding: 'pcm8' }, odd, { chunksAfterData: [{ id: 'iXML', body: Buffer.from('<BWFXML/>') }] });
    const decoded = await decodeWav(file);
    expect(decoded.frames).toBe(1001);
    expect(decoded.metadata.ixml).toBe('<BWFXML/>');
    expect(decoded.metadata.headerIssues).toEqual([]);
  });

  // EBU Tech 3285 v2 bext field layout.
  it('parses bext before or after the audio, and keeps iXML raw', async () => {
    const bext = bextBody({
      description: 'Scene 4 take 2',
      originator: 'FieldRec',
      originatorReference: 'REF123',
      originationDate: '2026-12-01',
      originationTime: '10:20:30',
      timeReference: 2 ** 32 + 48000 * 3600,
      codingHistory: 'A=PCM,F=48000,W=24,M=mono,T=original\r\n',
    });
    const ixml = '<?xml version="1.0"?><BWFXML><SCENE>4</SCENE></BWFXML>';
    for (const where of ['chunksBeforeData', 'chunksAfterData'] as const) {
      const decoded = await decodeWav(wavFile(layout, audio, { [where]: [{ id: 'bext', body: bext }, { id: 'iXML', body: Buffer.from(ixml) }] }));
      expect(decoded.metadata.bext).toEqual({
        description: 'Scene 4 take 2',
        originator: 'FieldRec',
        originatorReference: 'REF123',
        originationDate: '2026-12-01',
        originationTime: '10:20:30',
        timeReference: 2 ** 32 + 48000 * 3600,
        codingHistory: 'A=PCM,F=48000,W=24,M=mono,T=original',
      });
      expect(decoded.metadata.ixml).toBe(ixml);
    }
  });

  it('reads a small RF64 file whose sizes are in ds64 (EBU Tech 3306)', async () => {
    const decoded = await decodeWav(wavFile(layout, audio, { rf64: true }));
    expect(decoded.format.container).toBe('RF64');
    expect(decoded.format.declaredDataBytes).toBe(audio.length);
    expect(decoded.frames).toBe(1001);
    expect(decoded.metadata.headerIssues).toEqual([]);
  });

  it('decodes NaN and ±Inf float samples (IEEE 754) as 0, counting them per channel with the first frame', async () => {
    const channels = testChannels(2, 3000, 4);
    channels[1][1500] = Number.NaN;
    channels[1][2999] = Number.POSITIVE_INFINITY;
    channels[0][2500] = Number.NEGATIVE_INFINITY;
    for (const coding of ['float32', 'float64'] as const) {
      const wav = await openWav(bufferStream(wavFile({ sampleRate: RATE, channels: 2, coding }, encodeSamples(channels, coding))), { blockFrames: 1000 });
      let finite = true;
      for await (const block of wav.blocks()) for (const channel of block.channels) for (let i = 0; i < block.frames; i++) finite &&= Number.isFinite(channel[i]);
      expect(finite).toBe(true);
      expect(wav.nonFiniteSamples()).toEqual({ perChannel: [1, 2], firstFrame: 1500 });
    }
  });

  it('takes valid bits and the channel mask from WAVE_FORMAT_EXTENSIBLE', async () => {
    const decoded = await decodeWav(wavFile({ sampleRate: RATE, channels: 2, coding: 'pcm24', extensibleMask: 0x3, validBits: 20 }, encodeSamples(testChannels(2, 10), 'pcm24')));
    expect(decoded.format.validBitsPerSample).toBe(20);
    expect(decoded.format.channelMask).toBe(3);
  });
});

describe('header sizes that disagree with the bytes present: analysed, and reported', () => {
  const layout: WavLayout = { sampleRate: RATE, channels: 2, coding: 'pcm24' };
  const audio = encodeSamples(testChannels(2, 4800), 'pcm24');

  it.each([
    ['0', 0],
    ['0xFFFFFFFF', 0xffffffff],
  ])('data size %s (recording never closed): reads all the audio present', async (_, sizeField) => {
    const decoded = await decodeWav(wavFile(layout, audio, { dataSizeField: sizeField, riffSizeField: sizeField }));
    expect(decoded.frames).toBe(4800);
    expect(decoded.metadata.headerIssues.length).toBeGreaterThan(0);
    expect(decoded.metadata.headerIssues.join(' ')).toMatch(/does not record the audio's length/);
  });

  it('data size past the end of the file (file cut short): reads what is there', async () => {
    const file = wavFile(layout, audio);
    const cut = file.subarray(0, file.length - 6000 - 2); // also leaves a partial frame
    const decoded = await decodeWav(cut);
    expect(decoded.frames).toBe(4800 - 1001);
    expect(decoded.metadata.headerIssues.join(' ')).toMatch(/cut short/);
    expect(decoded.metadata.headerIssues.join(' ')).toMatch(/partial frame/);
  });

  it('bytes after the declared end are reported but not read as audio', async () => {
    const file = Buffer.concat([wavFile(layout, audio), Buffer.from('garbage!')]);
    const decoded = await decodeWav(file);
    expect(decoded.frames).toBe(4800);
    expect(decoded.metadata.headerIssues.length).toBe(1);
  });
});

describe('refusals: one typed error with a one-line message, never a crash or hang', () => {
  const layout: WavLayout = { sampleRate: RATE, channels: 1, coding: 'pcm16' };
  const audio = encodeSamples(testChannels(1, 100), 'pcm16');
  const good = wavFile(layout, audio);
  /** A copy of the good file with one fmt field changed (the fmt body starts at byte 20). */
  const withFmtField = (offset: number, write: (buffer: Buffer, at: number) => void) => {
    const copy = Buffer.from(good);
    write(copy, 20 + offset);
    return copy;
  };

  const cases: [string, Buffer, string][] = [
    ['an empty file', Buffer.alloc(0), 'truncated-header'],
    ['a text file', Buffer.from('hello, this is not audio at all'), 'not-wav'],
    ['a RIFF file that is not WAVE', Buffer.concat([Buffer.from('RIFF'), Buffer.alloc(4), Buffer.from('AVI '), Buffer.alloc(64)]), 'not-wav'],
    ['a RIFF header cut short', good.subarray(0, 10), 'truncated-header'],
    ['a header cut inside fmt', good.subarray(0, 28), 'truncated-header'],
    ['no fmt chunk', wavFile(layout, audio, { omitFmt: true }), 'no-fmt'],
    ['fmt but no data chunk', good.subarray(0, 36), 'no-data'],
    ['zero channels', withFmtField(2, (b, at) => b.writeUInt16LE(0, at)), 'bad-fmt'],
    ['65 channels', withFmtField(2, (b, at) => b.writeUInt16LE(65, at)), 'bad-fmt'],
    ['a sample rate of 0', withFmtField(4, (b, at) => b.writeUInt32LE(0, at)), 'bad-fmt'],
    ['a sample rate of 10 MHz', withFmtField(4, (b, at) => b.writeUInt32LE(10_000_000, at)), 'bad-fmt'],
    ['zero bits per sample', withFmtField(14, (b, at) => b.writeUInt16LE(0, at)), 'bad-fmt'],
    ['A-law encoding', withFmtField(0, (b, at) => b.writeUInt16LE(6, at)), 'unsupported-encoding'],
    ['MP3 encoding', withFmtField(0, (b, at) => b.writeUInt16LE(0x55, at)), 'unsupported-encoding'],
    ['48-bit integer PCM', withFmtField(14, (b, at) => b.writeUInt16LE(48, at)), 'unsupported-encoding'],
    ['a chunk running past the end before the audio', wavFile(layout, audio, { chunksBeforeFmt: [{ id: 'LIST', body: Buffer.alloc(10) }] }).fill(0xff, 16, 20), 'chunk-overrun'],
    ['data before fmt with no fmt at all', wavFile(layout, audio, { omitFmt: true, dataBeforeFmt: true }), 'no-fmt'],
    ['data before fmt, from a stream', wavFile(layout, audio, { dataBeforeFmt: true }), 'data-before-fmt'],
  ];
  it.each(cases)('refuses %s', async (_, file, reason) => {
    const attempt = (async () => {
      const wav = await openWav(bufferStream(file, 13));
      for await (const block of wav.blocks()) void block;
    })();
    const error = await attempt.then(() => null, (caught: unknown) => caught);
    expect(error).toBeInstanceOf(UnreadableWavError);
    expect((error as UnreadableWavError).reason).toBe(reason);
    expect((error as Error).message).not.toMatch(/\n/);
    expect((error as Error).message.length).toBeGreaterThan(10);
  });

  it('refuses an extensible sub-format other than PCM or float', async () => {
    const body = fmtBody({ sampleRate: RATE, channels: 1, coding: 'pcm16', extensibleMask: 4 });
    body.writeUInt16LE(2, 24); // ADPCM sub-format GUID
    const file = Buffer.from(good);
    const extensible = Buffer.concat([file.subarray(0, 12), Buffer.from('fmt '), Buffer.from([40, 0, 0, 0]), body, file.subarray(36)]);
    await expect(openWav(bufferStream(extensible))).rejects.toThrow(UnreadableWavError);
  });

  it('reads audio before fmt when it may reopen the file at an offset', async () => {
    const file = wavFile(layout, audio, { dataBeforeFmt: true });
    const wav = await openWav(bufferStream(file), { reopenAt: (offset) => bufferStream(file.subarray(offset)) });
    let frames = 0;
    for await (const block of wav.blocks()) frames += block.frames;
    expect(frames).toBe(100);
    expect(wav.metadata.headerIssues.join(' ')).toMatch(/before the fmt chunk/);
  });
});
