/**
 * How measures are written in words: the one place for clock times, frequencies, levels with
 * units, channel names and format descriptions. Findings use it here; the web app, PDF, CSV and
 * e-mail re-export it, so a take reads the same everywhere. Browser-safe (no Node imports).
 */

/** Seconds as m:ss.s (or h:mm:ss.s); `decimals` 0 gives m:ss. Negative times read as 0. */
export function formatClock(seconds: number, decimals: 0 | 1 = 1): string {
  const scale = decimals === 1 ? 10 : 1;
  const units = Math.max(0, Math.round(seconds * scale));
  const hours = Math.floor(units / (3600 * scale));
  const minutes = Math.floor((units % (3600 * scale)) / (60 * scale));
  const secondsPart = ((units % (60 * scale)) / scale).toFixed(decimals).padStart(decimals === 1 ? 4 : 2, '0');
  return hours > 0 ? `${hours}:${String(minutes).padStart(2, '0')}:${secondsPart}` : `${minutes}:${secondsPart}`;
}

/** A frequency in kHz with as many decimals as it needs (44.1 kHz, 48 kHz, 11.025 kHz). */
export function formatKhz(hz: number): string {
  return `${Number((hz / 1000).toFixed(3))} kHz`;
}

/** A number with its unit, or an em dash when there is no value. */
export function formatMeasure(value: number | null | undefined, decimals = 1, unit = ''): string {
  if (value == null || !Number.isFinite(value)) return '—';
  // A value that rounds to zero reads "0.00", never "-0.00".
  const digits = value.toFixed(decimals).replace(/^-(?=0(\.0*)?$)/, '');
  return `${digits}${unit ? ` ${unit}` : ''}`;
}

/** "3 dropouts", "1 dropout". */
export function plural(count: number, word: string): string {
  return `${count} ${word}${count === 1 ? '' : 's'}`;
}

/** How a channel is known beyond its position: its name (iXML track or loudspeaker) and whether it is an iso track. */
export interface ChannelLabel {
  name: string | null;
  isTrack: boolean;
}

/**
 * A channel in a sentence: "left channel", "right channel", "channel 3", "channel 3 (C)",
 * "track 2 (Boom)". Stereo keeps left/right; a name is added where there is one.
 */
export function channelName(channel: number, channelCount: number, label?: ChannelLabel): string {
  if (label?.isTrack) return `track ${channel + 1}${label.name ? ` (${label.name})` : ''}`;
  if (channelCount === 2) return `${channel === 0 ? 'left' : 'right'} channel`;
  return `channel ${channel + 1}${label?.name ? ` (${label.name})` : ''}`;
}

/** A channel on a lane or in a table cell: "L", "R", "ch 3", or its name. */
export function channelShortName(channel: number, channelCount: number, name?: string | null): string {
  if (name) return name;
  return channelCount === 2 ? (channel === 0 ? 'L' : 'R') : `ch ${channel + 1}`;
}

export interface FormatFacts {
  sampleRate: number | null;
  bitsPerSample: number | null;
  channels: number | null;
  encoding: string | null;
}

/** "48 kHz · 24-bit · stereo"; an em dash when the format is unknown. */
export function describeFormat(format: FormatFacts): string {
  if (!format.sampleRate) return '—';
  const bits = `${format.bitsPerSample}-bit${format.encoding === 'float' ? ' float' : ''}`;
  const layout = format.channels === 1 ? 'mono' : format.channels === 2 ? 'stereo' : `${format.channels} ch`;
  return `${formatKhz(format.sampleRate)} · ${bits} · ${layout}`;
}
