import { markerSamples, MARKER_SEC } from './markers';
import { designMultitone, multitonePeriod } from './multitone';

/**
 * The converter check signal: what it contains and when. Everything is defined in seconds and
 * hertz at the nominal sample rate, so the generator and the analysis derive the same timeline.
 *
 *   announce      six short 997 Hz beeps rising from −48 to −18 dB FS: "loud signal follows"
 *   startMarker   up-chirp (sync)                       all channels
 *   format        two −20 dB FS tones naming the written format: rate/64 Hz and 4000 + 100·bits Hz
 *   toneMinus1    997 Hz at −1 dB FS, 4 s                all channels (gain, THD+N, SINAD, ENOB, clock)
 *   toneMinus20   997 Hz at −20 dB FS, 3 s               all channels (THD+N)
 *   toneMinus60   997 Hz at −60 dB FS, 4 s               all channels (AES17 dynamic range)
 *   idle          digital silence, 4 s                   (idle noise)
 *   multitone     periodic multitone, 4 s                all channels (frequency response, delay)
 *   crosstalk     997 Hz + 9973 Hz at −7 dB FS each, 2 s one channel at a time (crosstalk)
 *   endMarker     down-chirp (sync)                      all channels
 *
 * 997 Hz rather than 1 kHz (AES17 practice: not a sub-multiple of common rates, so the tone
 * exercises many codes). The timeline does not depend on the sample rate (only the multitone's
 * grid and the format tones do), so a signal played at one rate and recorded at another is still
 * found. 24 s plus 2 s per channel: 28 s in stereo, 56 s for 16 channels.
 */

export type SectionName = 'announce' | 'startMarker' | 'format' | 'toneMinus1' | 'toneMinus20' | 'toneMinus60' | 'idle' | 'multitone' | 'crosstalk' | 'endMarker';

export interface CheckSection {
  name: SectionName;
  /** Start, seconds from the first sample of the signal (nominal rate). */
  startSec: number;
  durationSec: number;
  /** The one channel carrying this section (crosstalk), or null when it goes to every channel. */
  drivenChannel: number | null;
  /** Peak level of each tone, dB FS (a full-scale sine peaks at 0 dB FS); null for markers, multitone and idle. */
  levelDbfs: number | null;
  /** Tone frequencies, Hz (tones, beeps and crosstalk sections; the format section's depend on the format). */
  tonesHz: number[];
}

export interface CheckSignalLayout {
  channels: number;
  durationSec: number;
  sections: CheckSection[];
}

/** AES17 test frequency, Hz. */
export const CHECK_TONE_HZ = 997;
/** Upper crosstalk tone, Hz (a prime, so no harmonic of 997 Hz lands on it). */
export const CROSSTALK_HIGH_HZ = 9973;
export const MIN_CHECK_RATE_HZ = 32_000;
export const MAX_CHECK_RATE_HZ = 192_000;
/** Most channels in one check signal: 16 keeps it under a minute. */
export const MAX_CHECK_CHANNELS = 16;
/** Raised-cosine fade at both ends of every tone section, seconds (no clicks, no splatter). */
const FADE_SEC = 0.005;
const CROSSTALK_LEVEL_DBFS = -7;
const MARKER_PEAK_DBFS = -6;
const FORMAT_LEVEL_DBFS = -20;

/** The format section names the written rate by a tone at rate / 64 Hz (500–3000 Hz)… */
export const FORMAT_RATE_DIVISOR = 64;
/** …and the bit depth by a tone at 4000 + 100 × bits Hz (5600, 6400, 7200 Hz). */
export const FORMAT_BITS_BASE_HZ = 4000;
export const FORMAT_BITS_STEP_HZ = 100;

/** Frequencies of the format section's two tones, Hz. */
function formatTonesHz(sampleRate: number, bitsPerSample: number): [number, number] {
  return [sampleRate / FORMAT_RATE_DIVISOR, FORMAT_BITS_BASE_HZ + FORMAT_BITS_STEP_HZ * bitsPerSample];
}

/** @throws RangeError when the rate is outside 32–192 kHz */
export function assertCheckRate(sampleRate: number): void {
  if (!Number.isInteger(sampleRate) || sampleRate < MIN_CHECK_RATE_HZ || sampleRate > MAX_CHECK_RATE_HZ) {
    throw new RangeError(`A converter check needs a sample rate from ${MIN_CHECK_RATE_HZ} to ${MAX_CHECK_RATE_HZ} Hz (got ${sampleRate}).`);
  }
}

/**
 * The timeline of the check signal for a channel count.
 * @throws RangeError when the channel count is outside 1–16
 */
export function checkSignalLayout(channels: number): CheckSignalLayout {
  if (!Number.isInteger(channels) || channels < 1 || channels > MAX_CHECK_CHANNELS) {
    throw new RangeError(`A converter check signal has 1 to ${MAX_CHECK_CHANNELS} channels (got ${channels}).`);
  }
  const sections: CheckSection[] = [];
  let time = 0;
  const add = (name: SectionName, durationSec: number, levelDbfs: number | null = null, tonesHz: number[] = [], drivenChannel: number | null = null) => {
    sections.push({ name, startSec: time, durationSec, drivenChannel, levelDbfs, tonesHz });
    time += durationSec;
  };
  const rest = (seconds: number) => {
    time += seconds;
  };
  for (let beep = 0; beep < 6; beep++) {
    add('announce', 0.125, -48 + 6 * beep, [CHECK_TONE_HZ]);
    rest(0.125);
  }
  rest(0.5);
  add('startMarker', MARKER_SEC);
  rest(0.25);
  add('format', 0.5, FORMAT_LEVEL_DBFS);
  rest(0.25);
  add('toneMinus1', 4, -1, [CHECK_TONE_HZ]);
  add('toneMinus20', 3, -20, [CHECK_TONE_HZ]);
  add('toneMinus60', 4, -60, [CHECK_TONE_HZ]);
  add('idle', 4);
  add('multitone', 4);
  if (channels > 1) {
    for (let channel = 0; channel < channels; channel++) add('crosstalk', 2, CROSSTALK_LEVEL_DBFS, [CHECK_TONE_HZ, CROSSTALK_HIGH_HZ], channel);
  }
  rest(0.5);
  add('endMarker', MARKER_SEC);
  rest(0.5);
  return { channels, durationSec: time, sections };
}

/** The sections of one name, in order. */
export function sectionsNamed(layout: CheckSignalLayout, name: SectionName): CheckSection[] {
  return layout.sections.filter((section) => section.name === name);
}

/** The one section of a name (every name but announce and crosstalk occurs once). */
export function sectionNamed(layout: CheckSignalLayout, name: SectionName): CheckSection {
  const found = sectionsNamed(layout, name);
  if (found.length !== 1) throw new Error(`The check signal has ${found.length} ${name} sections.`);
  return found[0];
}

const sectionStartFrame = (section: CheckSection, sampleRate: number) => Math.round(section.startSec * sampleRate);
const sectionEndFrame = (section: CheckSection, sampleRate: number) => Math.round((section.startSec + section.durationSec) * sampleRate);

/** Renders the check signal block by block (float, full scale 1.0) without holding all of it. */
export class CheckSignalRenderer {
  readonly layout: CheckSignalLayout;
  readonly sampleRate: number;
  readonly totalFrames: number;
  private readonly formatTones: number[];
  private readonly startMarker: Float64Array;
  private readonly endMarker: Float64Array;
  private readonly multitone: Float64Array;
  private readonly fadeFrames: number;

  /** @param sampleRate Hz, 32–192 kHz @param bitsPerSample named by the format section */
  constructor(layout: CheckSignalLayout, sampleRate: number, bitsPerSample: number) {
    assertCheckRate(sampleRate);
    this.layout = layout;
    this.sampleRate = sampleRate;
    this.totalFrames = Math.round(layout.durationSec * sampleRate);
    this.formatTones = formatTonesHz(sampleRate, bitsPerSample);
    this.startMarker = markerSamples(sampleRate, 'up');
    this.endMarker = markerSamples(sampleRate, 'down');
    this.multitone = multitonePeriod(designMultitone(sampleRate));
    this.fadeFrames = Math.round(FADE_SEC * sampleRate);
  }

  /**
   * Writes frames [startFrame, startFrame + frames) into out[c][0..frames) and marks in
   * driven[c] the frames a section drives (1) — the writer dithers only those, so silent
   * stretches and undriven channels stay digital zero.
   */
  render(startFrame: number, frames: number, out: Float64Array[], driven: Uint8Array[]): void {
    const { sampleRate } = this;
    const { channels } = this.layout;
    for (let c = 0; c < channels; c++) {
      out[c].fill(0, 0, frames);
      driven[c].fill(0, 0, frames);
    }
    const blockEnd = startFrame + frames;
    for (const section of this.layout.sections) {
      if (section.name === 'idle') continue;
      const first = sectionStartFrame(section, sampleRate);
      const last = sectionEndFrame(section, sampleRate);
      const from = Math.max(first, startFrame);
      const to = Math.min(last, blockEnd);
      if (from >= to) continue;
      const targets = section.drivenChannel === null ? [...Array(channels).keys()] : [section.drivenChannel];
      const head = targets[0];
      this.renderSection(section, first, last, from, to, out[head], startFrame);
      for (const c of targets) {
        if (c !== head) out[c].set(out[head].subarray(from - startFrame, to - startFrame), from - startFrame);
        driven[c].fill(1, from - startFrame, to - startFrame);
      }
    }
  }

  /** Samples [from, to) of one section into `target` (indexed from blockStart). */
  private renderSection(section: CheckSection, first: number, last: number, from: number, to: number, target: Float64Array, blockStart: number): void {
    const { sampleRate } = this;
    if (section.name === 'startMarker' || section.name === 'endMarker') {
      const marker = section.name === 'startMarker' ? this.startMarker : this.endMarker;
      const amplitude = 10 ** (MARKER_PEAK_DBFS / 20);
      for (let n = from; n < to; n++) target[n - blockStart] = amplitude * (marker[n - first] ?? 0);
      return;
    }
    for (let n = from; n < to; n++) target[n - blockStart] = 0;
    if (section.name === 'multitone') {
      const period = this.multitone;
      for (let n = from; n < to; n++) target[n - blockStart] = period[(n - first) % period.length] * this.fade(n, first, last);
      return;
    }
    const amplitude = 10 ** ((section.levelDbfs ?? 0) / 20);
    for (const hz of section.name === 'format' ? this.formatTones : section.tonesHz) {
      const step = (2 * Math.PI * hz) / sampleRate;
      for (let n = from; n < to; n++) target[n - blockStart] += amplitude * Math.sin(step * (n - first)) * this.fade(n, first, last);
    }
  }

  /** Raised-cosine fade-in over the first and fade-out over the last FADE_SEC of a section. */
  private fade(n: number, first: number, last: number): number {
    const edge = Math.min(n - first, last - 1 - n);
    return edge >= this.fadeFrames ? 1 : 0.5 - 0.5 * Math.cos((Math.PI * (edge + 0.5)) / this.fadeFrames);
  }
}
