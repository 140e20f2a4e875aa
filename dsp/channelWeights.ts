/** WAVE_FORMAT_EXTENSIBLE speaker bits used below (Microsoft ksmedia.h). */
const SPEAKER_LOW_FREQUENCY = 0x8;
const SPEAKER_BACK_LEFT = 0x10;
const SPEAKER_BACK_RIGHT = 0x20;
const SPEAKER_SIDE_LEFT = 0x200;
const SPEAKER_SIDE_RIGHT = 0x400;

/** Surround weight of BS.1770 Table 3 (about +1.5 dB). */
const SURROUND_WEIGHT = 1.41;

/**
 * BS.1770 channel weights G_i for a layout: 1.0 for front channels, 1.41 for
 * the surrounds (BS.1770 Table 3; Annex 3 places them at 60-120 degrees
 * azimuth), 0 for the LFE, which the measure leaves out.
 * @param channels channel count
 * @param channelMask WAVE_FORMAT_EXTENSIBLE dwChannelMask, or null
 * @returns one weight per channel in file order
 */
export function loudnessChannelWeights(channels: number, channelMask: number | null): Float64Array {
  const weights = new Float64Array(channels).fill(1);
  if (channelMask) {
    const hasSides = (channelMask & (SPEAKER_SIDE_LEFT | SPEAKER_SIDE_RIGHT)) !== 0;
    let channel = 0;
    for (let bit = 1; bit <= 0x80000000 && channel < channels; bit *= 2) {
      if ((channelMask & bit) === 0) continue;
      if (bit === SPEAKER_LOW_FREQUENCY) weights[channel] = 0;
      else if (bit === SPEAKER_SIDE_LEFT || bit === SPEAKER_SIDE_RIGHT) weights[channel] = SURROUND_WEIGHT;
      // In 5.1 masks the surrounds may be flagged "back" (about 110 degrees); with sides present, backs sit behind (135+ degrees).
      else if ((bit === SPEAKER_BACK_LEFT || bit === SPEAKER_BACK_RIGHT) && !hasSides) weights[channel] = SURROUND_WEIGHT;
      channel++;
    }
    return weights;
  }
  // No mask: the conventional WAV orders (L R C Ls Rs for 5.0; L R C LFE Ls Rs for 5.1; 7.1 adds sides last).
  if (channels === 5) weights.set([1, 1, 1, SURROUND_WEIGHT, SURROUND_WEIGHT]);
  else if (channels === 6) weights.set([1, 1, 1, 0, SURROUND_WEIGHT, SURROUND_WEIGHT]);
  else if (channels === 8) weights.set([1, 1, 1, 0, 1, 1, SURROUND_WEIGHT, SURROUND_WEIGHT]);
  return weights;
}
