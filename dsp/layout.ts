/**
 * What the channels of a take are: one programme for loudspeakers (mono, stereo, surround) or
 * independent iso tracks (poly), and the name of each channel.
 *
 * Poly: an iXML TRACK_LIST (the production-recorder metadata of the iXML specification,
 * gallery.co.uk/ixml), or more than two channels with no loudspeaker layout declared. A two-track
 * list that names a left and a right feed (a recorder's stereo mix, "L"/"R", "Mix L"/"Mix R") is stereo.
 * Surround: a WAVE_FORMAT_EXTENSIBLE channel mask (Microsoft ksmedia.h speaker bits), or a
 * channel count that only the conventional loudspeaker orders use (5.0, 5.1, 7.1).
 */

import type { ChannelLayout } from './types';

export interface LayoutInfo {
  layout: ChannelLayout;
  /** One name per channel in file order: the iXML track name, the loudspeaker name, or null. */
  names: (string | null)[];
}

/** Loudspeaker names of the WAVE_FORMAT_EXTENSIBLE speaker bits, lowest bit first (Microsoft ksmedia.h order). */
const SPEAKER_NAMES = ['L', 'R', 'C', 'LFE', 'Lb', 'Rb', 'Lc', 'Rc', 'Cb', 'Ls', 'Rs', 'Tc', 'Tfl', 'Tfc', 'Tfr', 'Tbl', 'Tbc', 'Tbr'];
const SPEAKER_BACK_LEFT = 0x10;
const SPEAKER_BACK_RIGHT = 0x20;
const SPEAKER_SIDES = 0x200 | 0x400;

/** Conventional WAV channel orders without a mask (the same orders the loudness weights assume). */
const CONVENTIONAL_ORDERS: Record<number, string[]> = {
  2: ['L', 'R'],
  5: ['L', 'R', 'C', 'Ls', 'Rs'],
  6: ['L', 'R', 'C', 'LFE', 'Ls', 'Rs'],
  8: ['L', 'R', 'C', 'LFE', 'Lb', 'Rb', 'Ls', 'Rs'],
};

/**
 * Track names of the left and right feed of one stereo programme, as recorders and mixers name their
 * mix tracks: L/R, Left/Right, Lt/Rt, optionally after Mix, Main, Master or Stereo ("Mix L", "MixR",
 * "ST_Left") or before Mix ("L Mix") [common practice].
 */
const LEFT_FEED = /^(?:(?:mix|main|master|stereo|st)[\s_-]*)?(?:l|left|lt)(?:[\s_-]*mix)?$/i;
const RIGHT_FEED = /^(?:(?:mix|main|master|stereo|st)[\s_-]*)?(?:r|right|rt)(?:[\s_-]*mix)?$/i;

/** Longest track name kept, characters. */
const MAX_NAME_LENGTH = 64;

/**
 * The track names of an iXML chunk's TRACK_LIST, by position in the file (INTERLEAVE_INDEX,
 * else CHANNEL_INDEX, else list order). Only this one flat list is read, so a few patterns do
 * the job without an XML parser dependency.
 * @returns one entry per channel (null where the list names none), or null when there is no track list
 */
export function ixmlTrackNames(ixml: string | null | undefined, channels: number): (string | null)[] | null {
  if (!ixml) return null;
  const list = /<TRACK_LIST>([\s\S]*?)<\/TRACK_LIST>/i.exec(ixml);
  if (!list) return null;
  const names: (string | null)[] = new Array(channels).fill(null);
  let found = 0;
  const tracks = list[1].match(/<TRACK>[\s\S]*?<\/TRACK>/gi) ?? [];
  tracks.forEach((track, order) => {
    const field = (tag: string) => new RegExp(`<${tag}>([\\s\\S]*?)</${tag}>`, 'i').exec(track)?.[1].trim() ?? null;
    const index = Number(field('INTERLEAVE_INDEX') ?? field('CHANNEL_INDEX') ?? order + 1);
    const name = decodeXmlText(field('NAME') ?? '').slice(0, MAX_NAME_LENGTH).trim();
    if (!Number.isInteger(index) || index < 1 || index > channels) return;
    found++;
    names[index - 1] = name || null;
  });
  return found > 0 ? names : null;
}

function decodeXmlText(text: string): string {
  return text
    .replace(/<!\[CDATA\[([\s\S]*?)\]\]>/g, '$1')
    .replace(/&#(\d+);/g, (_, code) => String.fromCodePoint(Number(code)))
    .replace(/&#x([0-9a-f]+);/gi, (_, code) => String.fromCodePoint(parseInt(code, 16)))
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&amp;/g, '&');
}

/** Loudspeaker names of a channel mask, in file order; null when the mask does not cover every channel. */
function maskNames(channelMask: number, channels: number): string[] | null {
  const names: string[] = [];
  const hasSides = (channelMask & SPEAKER_SIDES) !== 0;
  for (let bit = 0; bit < SPEAKER_NAMES.length && names.length < channels; bit++) {
    const value = 2 ** bit;
    if ((channelMask & value) === 0) continue;
    // 5.1 masks often flag the surrounds "back"; without side speakers they are the surrounds.
    if (!hasSides && value === SPEAKER_BACK_LEFT) names.push('Ls');
    else if (!hasSides && value === SPEAKER_BACK_RIGHT) names.push('Rs');
    else names.push(SPEAKER_NAMES[bit]);
  }
  return names.length === channels ? names : null;
}

/**
 * The layout and channel names of a take.
 * @param channels channel count
 * @param channelMask WAVE_FORMAT_EXTENSIBLE dwChannelMask, or null
 * @param ixml the iXML chunk's text, or null
 */
export function channelLayout(channels: number, channelMask: number | null, ixml: string | null | undefined): LayoutInfo {
  const trackNames = channels > 1 ? ixmlTrackNames(ixml, channels) : null;
  const speakers = channelMask ? maskNames(channelMask, channels) : null;
  if (channels === 1) return { layout: 'mono', names: [ixmlTrackNames(ixml, 1)?.[0] ?? null] };
  const stereoFeeds = channels === 2 && trackNames !== null && LEFT_FEED.test(trackNames[0] ?? '') && RIGHT_FEED.test(trackNames[1] ?? '');
  if (stereoFeeds) return { layout: 'stereo', names: trackNames };
  if (trackNames && !speakers) return { layout: 'poly', names: trackNames };
  if (speakers) return { layout: channels === 2 ? 'stereo' : 'surround', names: speakers };
  const conventional = CONVENTIONAL_ORDERS[channels];
  if (channels === 2) return { layout: 'stereo', names: conventional };
  if (conventional) return { layout: 'surround', names: conventional };
  return { layout: 'poly', names: new Array(channels).fill(null) };
}
