import { formatClock } from '../format';
import { checkSignalLayout, MAX_CHECK_CHANNELS, sectionNamed } from './checkSignal';
import { ConverterCheckError } from './ConverterCheckError';
import type { MarkerCandidate } from './markerSearch';

/** Largest clock error between player and recorder searched for, relative (±1000 ppm). */
const MAX_CLOCK_ERROR = 1e-3;

export interface LocatedSignal {
  /** Frame of the start marker (within a few samples). */
  startFrame: number;
  /** Frame of the end marker. */
  endFrame: number;
  /** Channels the signal was written for (told by the distance between the markers). */
  channels: number;
  /** Mean normalised correlation of the two markers. */
  match: number;
}

/** Seconds from the start marker to the end marker for a channel count. */
export function markerDistanceSec(channels: number): number {
  const layout = checkSignalLayout(channels);
  return sectionNamed(layout, 'endMarker').startSec - sectionNamed(layout, 'startMarker').startSec;
}

/**
 * Pairs a start marker with an end marker whose distance fits a check signal of some channel
 * count within MAX_CLOCK_ERROR, preferring the best-matching pair.
 * @throws ConverterCheckError when no pair fits or the channel count differs from the recording's
 */
export function locateSignal(start: MarkerCandidate[], end: MarkerCandidate[], sampleRate: number, recordedChannels: number): LocatedSignal {
  let best: LocatedSignal | null = null;
  for (const opening of start) {
    for (const closing of end) {
      const distance = closing.frame - opening.frame;
      if (distance <= 0) continue;
      for (let channels = 1; channels <= MAX_CHECK_CHANNELS; channels++) {
        const nominal = markerDistanceSec(channels) * sampleRate;
        if (Math.abs(nominal / distance - 1) > MAX_CLOCK_ERROR) continue;
        const match = (opening.match + closing.match) / 2;
        if (!best || match > best.match) best = { startFrame: opening.frame, endFrame: closing.frame, channels, match };
      }
    }
  }
  const at = (frame: number) => formatClock(frame / sampleRate);
  if (!best) {
    if (start.length === 0 && end.length === 0) {
      throw new ConverterCheckError('no-signal', 'No converter check signal was found in this recording. Record the check signal written for this recorder, from before it starts until after it ends.');
    }
    if (end.length === 0) {
      throw new ConverterCheckError('incomplete-signal', `The check signal starts at ${at(start[0].frame)} but its end was not found: the recording probably stops too early.`);
    }
    if (start.length === 0) {
      throw new ConverterCheckError('incomplete-signal', `The end of the check signal was found at ${at(end[end.length - 1].frame)} but not its start: start recording before the signal plays.`);
    }
    throw new ConverterCheckError('incomplete-signal', 'Parts of a check signal were found, but its start and end are not the right distance apart: the playback was interrupted, or its speed is off by more than 0.1 %.');
  }
  if (best.channels !== recordedChannels) {
    throw new ConverterCheckError(
      'channel-count',
      `The check signal in this recording was written for ${best.channels} channel${best.channels === 1 ? '' : 's'} but the recording has ${recordedChannels}: write the check signal with ${recordedChannels} channel${recordedChannels === 1 ? '' : 's'}.`,
    );
  }
  return best;
}
