import type { AudioWindow } from './capture';
import { ConverterCheckError } from './ConverterCheckError';
import { markerDistanceSec, type LocatedSignal } from './locate';
import { refineMarker } from './markerRefine';

/** Where the check signal lies in each channel, from its own markers. */
export interface ChannelPlacement {
  /** Whether both of the channel's markers were found clearly. */
  responding: boolean[];
  /** Recording frames (fractional) of each channel's start and end markers; the live channels' mean for the others. */
  startFrames: number[];
  endFrames: number[];
  /** Summed polarity of the two markers per channel: negative when inverted, 0 when unknown. */
  polarity: number[];
  /** Mean normalised correlation of the live channels' markers. */
  markerMatch: number;
  /** Recorded / written frequency from the markers' distance (within a few ppm). */
  markerRatio: number;
  /** The channel whose start marker matches best. */
  lead: number;
}

/** A channel whose markers match less than this carries no usable signal. [common practice] */
const MIN_MARKER_MATCH = 0.3;

/**
 * Refines both markers in every channel from the captured windows around them.
 * @param windows per channel: [start-marker window, end-marker window, …]
 * @throws ConverterCheckError when no channel carries the markers clearly
 */
export function placeChannels(windows: AudioWindow[][], located: LocatedSignal, radius: number, sampleRate: number): ChannelPlacement {
  const markers = windows.map(([startAudio, endAudio]) => {
    const start = refineMarker(startAudio.samples, located.startFrame - startAudio.firstFrame, radius, sampleRate, 'up');
    const end = refineMarker(endAudio.samples, located.endFrame - endAudio.firstFrame, radius, sampleRate, 'down');
    return { start: { ...start, position: start.position + startAudio.firstFrame }, end: { ...end, position: end.position + endAudio.firstFrame } };
  });
  const responding = markers.map(({ start, end }) => start.match >= MIN_MARKER_MATCH && end.match >= MIN_MARKER_MATCH);
  const live = markers.flatMap((_, c) => (responding[c] ? [c] : []));
  if (live.length === 0) {
    throw new ConverterCheckError('no-signal', 'The check signal\'s markers were found but no channel carries them clearly enough to measure.');
  }
  const mean = (values: number[]) => values.reduce((sum, v) => sum + v, 0) / values.length;
  const meanStart = mean(live.map((c) => markers[c].start.position));
  const meanEnd = mean(live.map((c) => markers[c].end.position));
  return {
    responding,
    startFrames: markers.map(({ start }, c) => (responding[c] ? start.position : meanStart)),
    endFrames: markers.map(({ end }, c) => (responding[c] ? end.position : meanEnd)),
    polarity: markers.map(({ start, end }) => start.polarity + end.polarity),
    markerMatch: mean(live.map((c) => (markers[c].start.match + markers[c].end.match) / 2)),
    markerRatio: (markerDistanceSec(windows.length) * sampleRate) / mean(live.map((c) => markers[c].end.position - markers[c].start.position)),
    lead: live.reduce((best, c) => (markers[c].start.match > markers[best].start.match ? c : best), live[0]),
  };
}
