import { fftOfSize } from './fftCache';
import { markerTemplate, MARKER_TOP_HZ, type MarkerSweep } from './markers';

/**
 * First pass over a recording: where do the start and end markers match best? Each channel is
 * averaged over D samples (a boxcar: its zeros fall on the frequencies that would fold onto 0 Hz,
 * and the markers stay below 4 kHz, well under the reduced Nyquist frequency), then correlated by
 * FFT overlap-save with the complex chirps w·e^{iφ}, reduced the same way, so the magnitude does
 * not depend on the carrier phase and each output depends only on the samples under the template.
 * The match at a position is the best over the channels of the normalised correlation
 * |r| / (‖t‖·‖x‖) — 1 for a perfect copy at any gain or polarity — where ‖x‖ is the larger of the
 * window's energy and half that of a window twice as long around it (a quiet window beside loud
 * sound cannot match by chance; a real marker between pauses is not penalised). Taking the best
 * channel keeps channels with different delays or a dead channel from diluting the match; the four
 * loudest channels of each stretch are the ones correlated. The best match in every 2 ms is kept
 * when it could be a marker, so long recordings cost little memory.
 */
export interface MarkerCandidate {
  /** First frame of the marker in the recording (within `positionUncertainty`). */
  frame: number;
  /** Normalised correlation, 0–1. */
  match: number;
}

/** Matches below this are not markers (noise and the other sections stay under about 0.1). [common practice] */
const MIN_MATCH = 0.3;
/** Candidates kept per marker. */
const MAX_CANDIDATES = 12;
const POOL_SEC = 0.002;
/** The reduced rate stays at least this many times the top of the markers' band. */
const MIN_RATE_FACTOR = 3;

interface Pool {
  frames: number[];
  matches: number[];
  current: number;
  best: number;
  bestFrame: number;
}

export class MarkerSearch {
  /** How far, in frames, a candidate's frame may be from the marker's true start. */
  readonly positionUncertainty: number;
  private readonly channels: number;
  /** Samples averaged into one (D). */
  private readonly decimation: number;
  /** Template length at the reduced rate. */
  private readonly templateLength: number;
  private readonly fftSize: number;
  private readonly hop: number;
  private readonly fft: ReturnType<typeof fftOfSize>;
  private readonly templateSpectra: Float64Array[];
  private readonly templateNorm: number;
  private readonly buffers: Float64Array[];
  private readonly sums: Float64Array;
  /** One block's reduced samples per channel, before they join the buffers. */
  private readonly reduced: Float64Array[];
  private summed = 0;
  private filled = 0;
  /** Reduced-rate index of buffers[c][0]. */
  private bufferStart = 0;
  private readonly poolLength: number;
  private readonly pools: Pool[];
  private readonly spectrum: Float64Array;
  private readonly product: Float64Array;
  private readonly correlation: Float64Array;
  private readonly energyPrefix: Float64Array;
  private readonly matches: Float64Array[];

  /** @param sampleRate Hz (32–192 kHz) @param channels channels in the recording */
  constructor(sampleRate: number, channels: number) {
    this.channels = channels;
    this.decimation = 2 ** Math.max(0, Math.floor(Math.log2(sampleRate / (MIN_RATE_FACTOR * MARKER_TOP_HZ))));
    this.positionUncertainty = 2 * this.decimation + 2;
    const sweeps: MarkerSweep[] = ['up', 'down'];
    const templates = sweeps.map((sweep) => {
      const { re, im } = markerTemplate(sampleRate, sweep);
      return { re: this.reduce(re), im: this.reduce(im) };
    });
    this.templateLength = templates[0].re.length;
    this.fftSize = 2 ** Math.ceil(Math.log2(4 * this.templateLength));
    this.hop = this.fftSize - this.templateLength + 1;
    this.fft = fftOfSize(this.fftSize);
    this.templateSpectra = templates.map(({ re, im }) => {
      const complex = new Float64Array(2 * this.fftSize);
      for (let n = 0; n < re.length; n++) {
        complex[2 * n] = re[n];
        complex[2 * n + 1] = im[n];
      }
      const out = new Float64Array(2 * this.fftSize);
      this.fft.transform(out, complex);
      return out;
    });
    // The written marker is the real part: a perfect copy correlates to ‖re‖²·(1 + small).
    this.templateNorm = Math.sqrt(templates[0].re.reduce((sum, v) => sum + v * v, 0));
    this.buffers = Array.from({ length: channels }, () => new Float64Array(this.fftSize));
    this.sums = new Float64Array(channels);
    this.reduced = Array.from({ length: channels }, () => new Float64Array(0));
    this.poolLength = Math.max(1, Math.round((POOL_SEC * sampleRate) / this.decimation));
    this.pools = sweeps.map(() => ({ frames: [], matches: [], current: 0, best: 0, bestFrame: 0 }));
    this.spectrum = new Float64Array(2 * this.fftSize);
    this.product = new Float64Array(2 * this.fftSize);
    this.correlation = new Float64Array(2 * this.fftSize);
    this.energyPrefix = new Float64Array(this.fftSize + 1);
    this.matches = sweeps.map(() => new Float64Array(this.fftSize));
  }

  /** Pushes frames [0, frames) of each channel. */
  push(channels: Float64Array[], frames: number): void {
    const d = this.decimation;
    let offset = 0;
    if (this.summed > 0) {
      // Finish the group of D samples the last block left open.
      const take = Math.min(d - this.summed, frames);
      for (let c = 0; c < this.channels; c++) for (let k = 0; k < take; k++) this.sums[c] += channels[c][k];
      this.summed += take;
      offset = take;
      if (this.summed < d) return;
      if (this.reduced[0].length === 0) for (let c = 0; c < this.channels; c++) this.reduced[c] = new Float64Array(1);
      for (let c = 0; c < this.channels; c++) {
        this.reduced[c][0] = this.sums[c] / d;
        this.sums[c] = 0;
      }
      this.summed = 0;
      this.append(1);
    }
    const groups = Math.floor((frames - offset) / d);
    if (this.reduced[0].length < Math.max(1, groups)) {
      for (let c = 0; c < this.channels; c++) this.reduced[c] = new Float64Array(Math.max(1, groups));
    }
    for (let c = 0; c < this.channels; c++) {
      const x = channels[c];
      const out = this.reduced[c];
      for (let g = 0, n = offset; g < groups; g++) {
        let sum = 0;
        for (let k = 0; k < d; k++, n++) sum += x[n];
        out[g] = sum / d;
      }
      for (let n = offset + groups * d; n < frames; n++) this.sums[c] += x[n];
    }
    this.summed = frames - offset - groups * d;
    this.append(groups);
  }

  /** Appends the first `count` reduced samples of every channel, correlating each full buffer. */
  private append(count: number): void {
    let written = 0;
    while (written < count) {
      const take = Math.min(count - written, this.fftSize - this.filled);
      for (let c = 0; c < this.channels; c++) this.buffers[c].set(this.reduced[c].subarray(written, written + take), this.filled);
      this.filled += take;
      written += take;
      if (this.filled === this.fftSize) {
        this.process(this.fftSize - this.templateLength);
        for (const buffer of this.buffers) buffer.copyWithin(0, this.hop, this.fftSize);
        this.filled = this.templateLength - 1;
        this.bufferStart += this.hop;
      }
    }
  }

  /** The best start (up-chirp) and end (down-chirp) candidates, each in frame order. */
  finish(): { start: MarkerCandidate[]; end: MarkerCandidate[] } {
    if (this.filled >= this.templateLength) {
      for (const buffer of this.buffers) buffer.fill(0, this.filled);
      this.process(this.filled - this.templateLength);
    }
    const [start, end] = this.pools.map((pool) => {
      closePool(pool);
      return strongestApart(pool.frames, pool.matches, this.templateLength * this.decimation);
    });
    return { start, end };
  }

  /** The MAX_SEARCHED_CHANNELS channels with the most energy in the buffer (a dead channel is never among them while a live one is left out). */
  private loudestChannels(): number[] {
    const energies = this.buffers.map((x) => x.reduce((sum, v) => sum + v * v, 0));
    return energies.map((_, c) => c).sort((a, b) => energies[b] - energies[a]).slice(0, MAX_SEARCHED_CHANNELS);
  }

  /** Averages groups of D samples (the same reduction the recording gets). */
  private reduce(x: Float64Array): Float64Array {
    const d = this.decimation;
    const out = new Float64Array(Math.floor(x.length / d));
    for (let j = 0; j < out.length; j++) {
      let sum = 0;
      for (let k = 0; k < d; k++) sum += x[j * d + k];
      out[j] = sum / d;
    }
    return out;
  }

  /** Correlates the buffer at offsets 0..last and pools the matches. */
  private process(last: number): void {
    const size = this.fftSize;
    const length = this.templateLength;
    const floor = new Float64Array(last + 1);
    for (const matches of this.matches) matches.fill(0, 0, last + 1);
    for (const c of this.loudestChannels()) {
      const x = this.buffers[c];
      this.fft.realTransform(this.spectrum, x);
      this.fft.completeSpectrum(this.spectrum);
      const prefix = this.energyPrefix;
      for (let n = 0; n < size; n++) prefix[n + 1] = prefix[n] + x[n] * x[n];
      const energy = (from: number, to: number) => Math.max(0, prefix[Math.min(size, Math.max(0, to))] - prefix[Math.min(size, Math.max(0, from))]);
      for (let m = 0; m <= last; m++) {
        floor[m] = this.templateNorm * Math.sqrt(Math.max(energy(m, m + length), energy(m - (length >> 1), m + length + (length >> 1)) / 2));
      }
      this.templateSpectra.forEach((template, t) => {
        // Σk x[m + k]·conj(t[k]) = IFFT(X·conj(T)); offsets 0..last do not wrap.
        const product = this.product;
        for (let k = 0; k < size; k++) {
          const xr = this.spectrum[2 * k];
          const xi = this.spectrum[2 * k + 1];
          const tr = template[2 * k];
          const ti = template[2 * k + 1];
          product[2 * k] = xr * tr + xi * ti;
          product[2 * k + 1] = xi * tr - xr * ti;
        }
        this.fft.inverseTransform(this.correlation, product);
        const matches = this.matches[t];
        const correlation = this.correlation;
        for (let m = 0; m <= last; m++) {
          if (!(floor[m] > 1e-12)) continue;
          const match = Math.sqrt(correlation[2 * m] ** 2 + correlation[2 * m + 1] ** 2) / floor[m];
          if (match > matches[m]) matches[m] = match;
        }
      });
    }
    this.pools.forEach((pool, t) => {
      const matches = this.matches[t];
      for (let m = 0; m <= last; m++) {
        const index = this.bufferStart + m;
        const poolIndex = Math.floor(index / this.poolLength);
        if (poolIndex !== pool.current) {
          closePool(pool);
          pool.current = poolIndex;
        }
        if (matches[m] > pool.best) {
          pool.best = matches[m];
          pool.bestFrame = index * this.decimation;
        }
      }
    });
  }
}

/** Channels correlated per buffer, the loudest first: the markers drive every channel alike. */
const MAX_SEARCHED_CHANNELS = 4;

/** Keeps the pool's best match when it could be a marker, and empties the pool. */
function closePool(pool: Pool): void {
  if (pool.best >= MIN_MATCH) {
    pool.frames.push(pool.bestFrame);
    pool.matches.push(pool.best);
  }
  pool.best = 0;
}

/** The strongest matches at least `separation` frames apart, in frame order. */
function strongestApart(frames: number[], matches: number[], separation: number): MarkerCandidate[] {
  const order = matches.map((_, i) => i).sort((a, b) => matches[b] - matches[a]);
  const kept: MarkerCandidate[] = [];
  for (const i of order) {
    if (kept.length === MAX_CANDIDATES) break;
    if (kept.every((candidate) => Math.abs(candidate.frame - frames[i]) >= separation)) kept.push({ frame: frames[i], match: matches[i] });
  }
  return kept.sort((a, b) => a.frame - b.frame);
}
