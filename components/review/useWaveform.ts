'use client';

import { useEffect, useEffectEvent, useRef, useState } from 'react';
import type WaveSurfer from 'wavesurfer.js';
import type RegionsPlugin from 'wavesurfer.js/plugins/regions';
import { formatClock } from '@/lib/format';
import type { TimedMarker } from '@/lib/review/reportView';
import type { TakeCommentView, TakePeaks } from '@/lib/review/views';
import { SEVERITY } from './marks';
import type { ThemeColors } from '@/components/charts/useThemeColors';

/** Zoom levels in pixels per second; 0 fits the whole take. */
/** Zoom as a multiple of the width that shows the whole take, so short and long takes both zoom in usefully (1: whole take). */
export const ZOOM_STEPS = [1, 2, 4, 8, 16, 32, 64];

/** Pixels per second for a zoom factor: 0 lets the player fit the whole take. */
function pxPerSec(factor: number, container: HTMLElement | null, durationSec: number): number {
  return factor <= 1 || !container || durationSec <= 0 ? 0 : (factor * container.clientWidth) / durationSec;
}

type Regions = ReturnType<(typeof RegionsPlugin)['create']>;

export interface WaveformOptions {
  takeId: number;
  durationSec: number;
  channels: number;
  peaks: TakePeaks | null;
  colors: ThemeColors | null;
  volume: number;
  zoomIndex: number;
  markers: TimedMarker[];
  comments: TakeCommentView[];
  /** The playhead moved (playing, or a click on the waveform). */
  onTime: (seconds: number) => void;
  /** A region was clicked: a marker's id, or `comment-<id>`. */
  onRegionClick: (regionId: string, startSec: number) => void;
}

/** Height of one channel's lane, px. */
export const laneHeight = (channels: number) => (channels > 1 ? 88 : 140);

/** Findings on one lane closer than this share of the take share one label ("✕ Clip R +2"), so labels never stack over the region. */
const LABEL_GROUP_SHARE = 1 / 40;

/** One region per timed finding, coloured by severity and labelled; comments as thin markers. */
function drawRegions(
  regions: Regions,
  { markers, comments, colors, channels, durationSec }: { markers: TimedMarker[]; comments: TakeCommentView[]; colors: ThemeColors; channels: number; durationSec: number },
) {
  regions.clearRegions();
  const tone = { fail: 'fail', warn: 'warn', info: 'accent' } as const;
  const lastLabel = new Map<number, { startSec: number; label: HTMLSpanElement; text: string; names: string[] }>();
  for (const m of markers) {
    const lane = channels > 1 && m.channel != null ? m.channel : -1;
    const group = lastLabel.get(lane);
    if (group && m.startSec - group.startSec < durationSec * LABEL_GROUP_SHARE) {
      group.names.push(m.label);
      group.label.textContent = `${group.text} +${group.names.length - 1}`;
      group.label.title = group.names.join(', ');
      const region = regions.addRegion({ id: m.id, start: m.startSec, end: m.endSec, color: colors.alpha(tone[m.severity], 0.28), drag: false, resize: false, ...(lane >= 0 ? { channelIdx: lane } : {}) });
      region.element?.setAttribute('data-severity', m.severity);
      region.element?.setAttribute('data-kind', m.kind);
      continue;
    }
    const label = document.createElement('span');
    label.textContent = `${SEVERITY[m.severity].shape} ${m.label}`;
    lastLabel.set(lane, { startSec: m.startSec, label, text: label.textContent, names: [m.label] });
    label.className = 'tp-region-label';
    label.style.cssText = `display:inline-block;margin:2px;padding:0 4px;border-radius:3px;font-size:11px;font-weight:600;white-space:nowrap;background:${colors.surface};color:${colors[tone[m.severity]]};border:1px solid ${colors[tone[m.severity]]}`;
    const region = regions.addRegion({
      id: m.id,
      start: m.startSec,
      end: m.endSec,
      color: colors.alpha(tone[m.severity], 0.28),
      content: label,
      drag: false,
      resize: false,
      ...(channels > 1 && m.channel != null ? { channelIdx: m.channel } : {}),
    });
    region.element?.setAttribute('data-severity', m.severity);
    region.element?.setAttribute('data-kind', m.kind);
  }
  for (const c of comments) {
    const label = document.createElement('span');
    label.textContent = `✎ ${c.body.length > 24 ? `${c.body.slice(0, 23)}…` : c.body}`;
    label.style.cssText = `display:inline-block;margin-top:${channels > 1 ? 150 : 100}px;padding:0 4px;font-size:11px;white-space:nowrap;background:${colors.surface};color:${colors.accent}`;
    const region = regions.addRegion({ id: `comment-${c.id}`, start: c.atSec, color: colors.accent, content: label, drag: false, resize: false });
    region.element?.setAttribute('data-kind', 'comment');
  }
}

/**
 * The wavesurfer player of a take: drawn from the server's peaks, its audio streamed by range
 * requests. Built once the peaks and the palette are known; later theme, volume, zoom and marker
 * changes are applied to the same player, so the playhead stays where it is.
 */
export function useWaveform({ takeId, durationSec, channels, peaks, colors, volume, zoomIndex, markers, comments, onTime, onRegionClick }: WaveformOptions) {
  const containerRef = useRef<HTMLDivElement>(null);
  const timelineRef = useRef<HTMLDivElement>(null);
  const playerRef = useRef<WaveSurfer | null>(null);
  const regionsRef = useRef<Regions | null>(null);
  const [ready, setReady] = useState(false);
  const [playing, setPlaying] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);

  // What the player starts with; read when it is built, not reasons to build it again.
  const startSettings = useEffectEvent(() => ({ palette: colors, startVolume: volume, minPxPerSec: pxPerSec(ZOOM_STEPS[zoomIndex], containerRef.current, durationSec) }));
  const timeMoved = useEffectEvent((seconds: number) => onTime(seconds));
  const regionClicked = useEffectEvent((id: string, start: number) => onRegionClick(id, start));
  const haveColors = colors !== null;

  useEffect(() => {
    const { palette, startVolume, minPxPerSec } = startSettings();
    if (!peaks || !haveColors || !palette || !containerRef.current || !timelineRef.current) return;
    let destroyed = false;
    let ws: WaveSurfer | null = null;
    const media = document.createElement('audio');
    media.preload = 'metadata';
    media.src = `/api/takes/${takeId}/audio`;
    media.volume = startVolume;
    (async () => {
      const [{ default: WaveSurferClass }, { default: Regions }, { default: Timeline }] = await Promise.all([
        import('wavesurfer.js'),
        import('wavesurfer.js/plugins/regions'),
        import('wavesurfer.js/plugins/timeline'),
      ]);
      if (destroyed || !containerRef.current || !timelineRef.current) return;
      const regions = Regions.create();
      const lane = { waveColor: palette.ink, progressColor: palette.accent, height: laneHeight(channels) };
      ws = WaveSurferClass.create({
        container: containerRef.current,
        media,
        peaks: peaks.peaks,
        duration: peaks.duration || durationSec,
        waveColor: palette.ink,
        progressColor: palette.accent,
        cursorColor: palette.ink,
        cursorWidth: 2,
        height: laneHeight(channels),
        normalize: false,
        ...(channels > 1 ? { splitChannels: Array.from({ length: peaks.peaks.length }, () => lane) } : {}),
        minPxPerSec,
        autoScroll: true,
        dragToSeek: true,
        plugins: [
          regions,
          Timeline.create({
            container: timelineRef.current,
            height: 22,
            formatTimeCallback: (s) => formatClock(s).replace(/\.0$/, ''),
            // A CSS variable reaches into the timeline's shadow DOM, so the labels follow the theme.
            style: { color: 'rgb(var(--tp-muted))', fontSize: '11px' },
          }),
        ],
      });
      playerRef.current = ws;
      regionsRef.current = regions;
      ws.on('ready', () => setReady(true));
      ws.on('decode', () => setReady(true));
      ws.on('play', () => setPlaying(true));
      ws.on('pause', () => setPlaying(false));
      ws.on('finish', () => setPlaying(false));
      ws.on('timeupdate', (t) => timeMoved(t));
      ws.on('error', (error) => setFailure(`The audio could not be played: ${(error as Error).message ?? String(error)}`));
      regions.on('region-clicked', (region, event) => {
        event.stopPropagation();
        regionClicked(region.id, region.start);
      });
    })().catch((error: Error) => setFailure(`The waveform could not be drawn: ${error.message}`));
    return () => {
      destroyed = true;
      setReady(false);
      ws?.destroy();
      playerRef.current = null;
      regionsRef.current = null;
      media.pause();
      media.removeAttribute('src');
      media.load();
    };
  }, [peaks, haveColors, takeId, channels, durationSec]);

  // A theme change recolours the drawn waveform in place.
  useEffect(() => {
    if (!ready || !colors) return;
    const lane = { waveColor: colors.ink, progressColor: colors.accent };
    playerRef.current?.setOptions({
      waveColor: colors.ink,
      progressColor: colors.accent,
      cursorColor: colors.ink,
      ...(channels > 1 ? { splitChannels: Array.from({ length: channels }, () => ({ ...lane, height: laneHeight(channels) })) } : {}),
    });
  }, [colors, ready, channels]);

  useEffect(() => {
    if (ready && regionsRef.current && colors) drawRegions(regionsRef.current, { markers, comments, colors, channels, durationSec });
  }, [ready, markers, comments, colors, channels, durationSec]);

  useEffect(() => {
    playerRef.current?.setVolume(volume);
  }, [volume]);

  useEffect(() => {
    if (ready) playerRef.current?.zoom(pxPerSec(ZOOM_STEPS[zoomIndex], containerRef.current, durationSec));
  }, [zoomIndex, ready, durationSec]);

  return {
    containerRef,
    timelineRef,
    ready,
    playing,
    failure,
    /** Moves the playhead (and tells `onTime` at once, before the media element catches up). */
    seek(seconds: number, play = false) {
      const ws = playerRef.current;
      if (!ws) return;
      ws.setTime(seconds);
      onTime(seconds);
      if (play) void ws.play().catch(() => undefined);
    },
    playPause() {
      void playerRef.current?.playPause().catch(() => undefined);
    },
    currentTime: () => playerRef.current?.getCurrentTime() ?? 0,
    isPlaying: () => playerRef.current?.isPlaying() ?? false,
  };
}
