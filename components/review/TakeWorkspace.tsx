'use client';

import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type WaveSurfer from 'wavesurfer.js';
import type RegionsPlugin from 'wavesurfer.js/plugins/regions';
import { fetchJson } from '@/lib/http/fetcher';
import { channelShortName, formatClock } from '@/lib/format';
import { cueTime, neighbourMarker, type TimedMarker } from '@/lib/review/reportView';
import { SEVERITY, SeverityMark } from './marks';
import { useThemeColors } from './useThemeColors';
import type { TakeCommentView } from '@/lib/review/views';

interface PeaksAnswer {
  duration: number;
  channels: number;
  peaks: number[][];
}

/** Monitors start quiet; a take that clips or overs starts quieter still. */
const START_VOLUME = 0.3;
const CAUTION_VOLUME = 0.1;
const ZOOM_STEPS = [0, 20, 50, 100, 200, 500, 1000];

/** Keys in these elements belong to the element, not to the player. */
function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el || !el.tagName) return false;
  return el.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(el.tagName);
}

export interface WorkspaceProps {
  takeId: number;
  durationSec: number;
  channels: number;
  markers: TimedMarker[];
  comments: TakeCommentView[];
  caution: string | null;
  /** Called with the playhead time whenever it moves (the comment form uses it). */
  onTime?: (seconds: number) => void;
  /** Lets siblings (the comment list) move the playhead. */
  seekRef?: React.MutableRefObject<((seconds: number, play?: boolean) => void) | null>;
}

/**
 * The waveform (drawn from the server's peaks, the audio streamed by range
 * requests), its marked regions, transport and zoom, and the list of timed findings.
 */
export function TakeWorkspace({ takeId, durationSec, channels, markers, comments, caution, onTime, seekRef }: WorkspaceProps) {
  const colors = useThemeColors();
  const waveRef = useRef<HTMLDivElement>(null);
  const timelineRef = useRef<HTMLDivElement>(null);
  const wsRef = useRef<WaveSurfer | null>(null);
  const regionsRef = useRef<ReturnType<(typeof RegionsPlugin)["create"]> | null>(null);
  const listRef = useRef<HTMLOListElement>(null);
  const [ready, setReady] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const [playing, setPlaying] = useState(false);
  const [time, setTime] = useState(0);
  const [volume, setVolume] = useState(caution ? CAUTION_VOLUME : START_VOLUME);
  const [zoomIndex, setZoomIndex] = useState(0);
  const [selected, setSelected] = useState<number | null>(null);
  const [peaks, setPeaks] = useState<PeaksAnswer | null>(null);
  const volumeRef = useRef(volume);
  volumeRef.current = volume;
  const onTimeRef = useRef(onTime);
  onTimeRef.current = onTime;

  // The envelope, fine enough for the closest zoom on a laptop screen, capped for long takes.
  useEffect(() => {
    let cancelled = false;
    const buckets = Math.min(60_000, Math.max(2_000, Math.ceil(durationSec * 100)));
    fetchJson<PeaksAnswer>(`/api/takes/${takeId}/peaks?buckets=${buckets}`)
      .then((answer) => !cancelled && setPeaks(answer))
      .catch((error: Error) => !cancelled && setFailure(error.message));
    return () => {
      cancelled = true;
    };
  }, [takeId, durationSec]);

  // Create the waveform once the peaks and the palette are known; again when the theme changes.
  const colorsRef = useRef(colors);
  colorsRef.current = colors;
  const haveColors = colors !== null;

  useEffect(() => {
    const colors = colorsRef.current;
    if (!peaks || !colors || !waveRef.current || !timelineRef.current) return;
    let destroyed = false;
    let ws: WaveSurfer | null = null;
    const media = document.createElement('audio');
    media.preload = 'metadata';
    media.src = `/api/takes/${takeId}/audio`;
    media.volume = volumeRef.current;
    (async () => {
      const [{ default: WaveSurferClass }, { default: Regions }, { default: Timeline }] = await Promise.all([
        import('wavesurfer.js'),
        import('wavesurfer.js/plugins/regions'),
        import('wavesurfer.js/plugins/timeline'),
      ]);
      if (destroyed || !waveRef.current || !timelineRef.current) return;
      const regions = Regions.create();
      const lane = { waveColor: colors.ink, progressColor: colors.accent, height: channels > 1 ? 88 : 140 };
      ws = WaveSurferClass.create({
        container: waveRef.current,
        media,
        peaks: peaks.peaks,
        duration: peaks.duration || durationSec,
        waveColor: colors.ink,
        progressColor: colors.accent,
        cursorColor: colors.ink,
        cursorWidth: 2,
        height: channels > 1 ? 88 : 140,
        normalize: false,
        ...(channels > 1 ? { splitChannels: Array.from({ length: peaks.peaks.length }, () => lane) } : {}),
        minPxPerSec: ZOOM_STEPS[zoomIndexRef.current],
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
      wsRef.current = ws;
      regionsRef.current = regions;
      ws.on('ready', () => setReady(true));
      ws.on('decode', () => setReady(true));
      ws.on('play', () => setPlaying(true));
      ws.on('pause', () => setPlaying(false));
      ws.on('finish', () => setPlaying(false));
      ws.on('timeupdate', (t) => {
        setTime(t);
        onTimeRef.current?.(t);
      });
      ws.on('error', (error) => setFailure(`The audio could not be played: ${(error as Error).message ?? String(error)}`));
      regions.on('region-clicked', (region, event) => {
        event.stopPropagation();
        const index = markersRef.current.findIndex((m) => m.id === region.id);
        if (index >= 0) goTo(index, true);
        else ws?.setTime(cueTime(region.start));
      });
    })().catch((error: Error) => setFailure(`The waveform could not be drawn: ${error.message}`));
    return () => {
      destroyed = true;
      setReady(false);
      ws?.destroy();
      wsRef.current = null;
      regionsRef.current = null;
      media.pause();
      media.removeAttribute('src');
      media.load();
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [peaks, haveColors, takeId, channels, durationSec]);

  // A theme change recolours the drawn waveform in place (the playhead stays where it is).
  useEffect(() => {
    if (!ready || !colors) return;
    const lane = { waveColor: colors.ink, progressColor: colors.accent };
    wsRef.current?.setOptions({
      waveColor: colors.ink,
      progressColor: colors.accent,
      cursorColor: colors.ink,
      ...(channels > 1 ? { splitChannels: Array.from({ length: channels }, () => ({ ...lane, height: 88 })) } : {}),
    });
  }, [colors, ready, channels]);

  const markersRef = useRef(markers);
  markersRef.current = markers;
  const zoomIndexRef = useRef(zoomIndex);
  zoomIndexRef.current = zoomIndex;

  // Regions: one per timed finding, coloured by severity and labelled; comments as thin markers.
  useEffect(() => {
    const regions = regionsRef.current;
    if (!ready || !regions || !colors) return;
    regions.clearRegions();
    const tone = { fail: 'fail', warn: 'warn', info: 'accent' } as const;
    for (const m of markers) {
      const label = document.createElement('span');
      label.textContent = `${SEVERITY[m.severity].shape} ${m.label}`;
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
  }, [ready, markers, comments, colors, channels]);

  useEffect(() => {
    const ws = wsRef.current;
    if (ws) ws.setVolume(volume);
  }, [volume]);

  useEffect(() => {
    if (ready) wsRef.current?.zoom(ZOOM_STEPS[zoomIndex]);
  }, [zoomIndex, ready]);

  const seek = useCallback((seconds: number, play = false) => {
    const ws = wsRef.current;
    if (!ws) return;
    ws.setTime(seconds);
    setTime(seconds);
    onTimeRef.current?.(seconds);
    if (play) void ws.play().catch(() => undefined);
  }, []);

  const goTo = useCallback(
    (index: number, play: boolean) => {
      const marker = markersRef.current[index];
      if (!marker) return;
      setSelected(index);
      seek(cueTime(marker.startSec), play);
      listRef.current?.querySelectorAll('button')[index]?.scrollIntoView({ block: 'nearest' });
    },
    [seek],
  );

  useEffect(() => {
    if (seekRef) seekRef.current = seek;
  }, [seek, seekRef]);

  // Space plays or pauses, ← → move between findings; never while typing in a field.
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.defaultPrevented || event.altKey || event.ctrlKey || event.metaKey || isTyping(event.target)) return;
      const ws = wsRef.current;
      if (!ws) return;
      if (event.key === ' ') {
        event.preventDefault();
        void ws.playPause().catch(() => undefined);
      } else if (event.key === 'ArrowRight' || event.key === 'ArrowLeft') {
        // From the selected finding while the playhead is still on it (so findings at the same moment
        // are each reached in turn), else from the playhead.
        const now = ws.getCurrentTime();
        const direction = event.key === 'ArrowRight' ? 1 : -1;
        const current = selected !== null ? markersRef.current[selected] : undefined;
        const onCurrent = current && now >= cueTime(current.startSec) - 0.1 && now <= current.endSec + 0.5;
        const stepped = onCurrent ? selected! + direction : null;
        const index = stepped !== null ? (stepped >= 0 && stepped < markersRef.current.length ? stepped : null) : neighbourMarker(markersRef.current, now, direction);
        if (index === null) return;
        event.preventDefault();
        goTo(index, ws.isPlaying());
      }
    };
    // A focused button would also "click" on the space key's release; the key already played or paused.
    const onKeyUp = (event: KeyboardEvent) => {
      if (event.key === ' ' && !isTyping(event.target) && wsRef.current) event.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    window.addEventListener('keyup', onKeyUp);
    return () => {
      window.removeEventListener('keydown', onKey);
      window.removeEventListener('keyup', onKeyUp);
    };
  }, [goTo, selected]);

  const severityCounts = useMemo(() => {
    const counts = { fail: 0, warn: 0, info: 0 };
    for (const m of markers) counts[m.severity]++;
    return counts;
  }, [markers]);

  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_20rem]">
      <section className="tp-card min-w-0 p-4" aria-labelledby="waveform-heading">
        <div className="mb-3 flex flex-wrap items-center gap-3">
          <h2 id="waveform-heading" className="mr-auto text-lg font-semibold">
            Waveform
          </h2>
          <button type="button" className="tp-button min-w-24 justify-center" onClick={() => void wsRef.current?.playPause().catch(() => undefined)} disabled={!ready} aria-keyshortcuts="Space">
            <span aria-hidden="true">{playing ? '❚❚' : '▶'}</span>
            {playing ? 'Pause' : 'Play'}
          </button>
          <p className="font-mono text-sm" aria-live="off">
            <output data-testid="current-time" aria-label="Playhead">{formatClock(time)}</output>
            <span className="text-muted"> / {formatClock(durationSec)}</span>
          </p>
          <label className="flex items-center gap-2 text-sm">
            <span>Volume</span>
            <input type="range" min={0} max={1} step={0.05} value={volume} onChange={(e) => setVolume(Number(e.target.value))} className="w-24 accent-[rgb(var(--tp-accent))]" aria-valuetext={`${Math.round(volume * 100)} %`} />
            <span className="w-10 font-mono text-xs">{Math.round(volume * 100)} %</span>
          </label>
          <div className="flex items-center gap-1" role="group" aria-label="Zoom">
            <button type="button" className="tp-button-quiet px-2.5" onClick={() => setZoomIndex((z) => Math.max(0, z - 1))} disabled={zoomIndex === 0} aria-label="Zoom out">
              −
            </button>
            <span className="w-20 text-center text-xs text-muted" data-testid="zoom-level">
              {ZOOM_STEPS[zoomIndex] === 0 ? 'Whole take' : `${ZOOM_STEPS[zoomIndex]} px/s`}
            </span>
            <button type="button" className="tp-button-quiet px-2.5" onClick={() => setZoomIndex((z) => Math.min(ZOOM_STEPS.length - 1, z + 1))} disabled={zoomIndex === ZOOM_STEPS.length - 1} aria-label="Zoom in">
              +
            </button>
          </div>
        </div>
        {caution && (
          <p role="alert" className="mb-3 rounded-md border border-warn bg-sunken p-3 text-sm" data-testid="hearing-caution">
            <strong className="text-warn">
              <span aria-hidden="true">▲ </span>Caution, loud:
            </strong>{' '}
            {caution} The player starts at {Math.round(CAUTION_VOLUME * 100)} % volume.
          </p>
        )}
        {failure && (
          <p role="alert" className="mb-3 text-sm text-fail">
            <span aria-hidden="true">✕ </span>
            {failure}
          </p>
        )}
        {channels > 1 && (
          <p className="mb-1 text-xs text-muted">
            One lane per channel, top to bottom: {Array.from({ length: channels }, (_, i) => channelShortName(i, channels)).join(', ')}.
          </p>
        )}
        <div className="rounded-md border border-line bg-sunken">
          <div ref={waveRef} data-testid="waveform" aria-label="Waveform of the take; click to move the playhead" />
          <div ref={timelineRef} aria-hidden="true" />
        </div>
        {!ready && !failure && <p className="mt-2 text-sm text-muted">Drawing the waveform…</p>}
        <p className="mt-2 text-xs text-muted">
          Keys: <kbd>Space</kbd> play or pause · <kbd>←</kbd> <kbd>→</kbd> previous or next finding. Time axis in minutes:seconds.
        </p>
      </section>

      <section className="tp-card p-4" aria-labelledby="findings-heading">
        <h2 id="findings-heading" className="text-lg font-semibold">
          Findings in time
        </h2>
        <p className="mb-2 text-xs text-muted">
          {markers.length === 0
            ? 'Nothing in this take is tied to a moment in time.'
            : `${markers.length} marked: ${severityCounts.fail} fail, ${severityCounts.warn} warn, ${severityCounts.info} note. Click one to hear it from a second before.`}
        </p>
        <ol ref={listRef} className="max-h-[28rem] space-y-1 overflow-y-auto" data-testid="findings-list">
          {markers.map((m, i) => (
            <li key={m.id}>
              <button
                type="button"
                className={`w-full rounded-md border px-2 py-1.5 text-left text-sm hover:bg-sunken ${selected === i ? 'border-accent bg-sunken' : 'border-transparent'}`}
                aria-current={selected === i ? 'true' : undefined}
                onClick={() => goTo(i, true)}
                data-start={m.startSec}
              >
                <span className="flex items-center gap-2">
                  <SeverityMark severity={m.severity} />
                  <span className="font-mono text-xs">{formatClock(m.startSec)}</span>
                  <span className="font-semibold">{m.label}</span>
                </span>
                <span className="block text-xs text-muted">{m.message}</span>
              </button>
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
