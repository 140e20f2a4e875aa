'use client';

import { useImperativeHandle, useState, type Ref } from 'react';
import { formatClock } from '@/lib/format';
import type { Finding } from '@/dsp/types';
import { CHECK_LABEL } from '@/lib/review/reportView';
import { cueTime, stepMarker, type TimedMarker } from '@/lib/review/reportView';
import type { TakeCommentView } from '@/lib/review/views';
import { FindingsList } from './FindingsList';
import { SeverityMark } from './marks';
import { usePeaks } from './usePeaks';
import { usePlayerKeys } from './usePlayerKeys';
import { useThemeColors } from '@/components/charts/useThemeColors';
import { laneHeight, useWaveform, ZOOM_STEPS } from './useWaveform';

/** Monitors start quiet; a take that clips or overs starts quieter still. */
const START_VOLUME = 0.3;
const CAUTION_VOLUME = 0.1;

/** What siblings (the comment list) may do with the player. */
export interface PlayerHandle {
  seek: (seconds: number, play?: boolean) => void;
}

export interface WorkspaceProps {
  takeId: number;
  durationSec: number;
  channels: number;
  /** Each channel's lane: its track or loudspeaker name, and whether it carries no programme. */
  lanes: { name: string; silent: boolean }[];
  markers: TimedMarker[];
  /** Findings that belong to the whole take rather than a moment (bit depth, bandwidth, a dead track). */
  untimed: Finding[];
  comments: TakeCommentView[];
  caution: string | null;
  /** Called with the playhead time whenever it moves (the comment form uses it). */
  onTime?: (seconds: number) => void;
  ref?: Ref<PlayerHandle>;
}

/** The waveform with its marked regions, transport and zoom, and the list of timed findings. */
export function TakeWorkspace({ takeId, durationSec, channels, lanes, markers, untimed, comments, caution, onTime, ref }: WorkspaceProps) {
  const colors = useThemeColors();
  const { peaks, error: peaksError } = usePeaks(takeId, durationSec);
  const [time, setTime] = useState(0);
  const [volume, setVolume] = useState(caution ? CAUTION_VOLUME : START_VOLUME);
  const [zoomIndex, setZoomIndex] = useState(0);
  const [selected, setSelected] = useState<number | null>(null);

  const timeMoved = (seconds: number) => {
    setTime(seconds);
    onTime?.(seconds);
  };
  const { containerRef, timelineRef, ready, playing, failure: playerFailure, seek, playPause, currentTime, isPlaying } = useWaveform({
    takeId, durationSec, channels, peaks, colors, volume, zoomIndex, markers, comments,
    onTime: timeMoved,
    onRegionClick: regionClicked,
  });

  function goTo(index: number, play: boolean) {
    const marker = markers[index];
    if (!marker) return;
    setSelected(index);
    seek(cueTime(marker.startSec), play);
  }

  function regionClicked(id: string, startSec: number) {
    const index = markers.findIndex((m) => m.id === id);
    if (index >= 0) goTo(index, true);
    else seek(cueTime(startSec));
  }

  useImperativeHandle(ref, () => ({ seek }));
  usePlayerKeys(ready, {
    playPause,
    step: (direction) => {
      const index = stepMarker(markers, selected, currentTime(), direction);
      if (index === null) return false;
      goTo(index, isPlaying());
      return true;
    },
  });

  const failure = playerFailure ?? peaksError;
  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_20rem]">
      <section className="tp-card min-w-0 p-4" aria-labelledby="waveform-heading">
        <div className="mb-3 flex flex-wrap items-center gap-3">
          <h2 id="waveform-heading" className="mr-auto text-lg font-semibold">
            Waveform
          </h2>
          <button type="button" className="tp-button min-w-24 justify-center" onClick={playPause} disabled={!ready} aria-keyshortcuts="Space">
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
              {ZOOM_STEPS[zoomIndex] === 1 ? 'Whole take' : `× ${ZOOM_STEPS[zoomIndex]}`}
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
            One lane per channel, top to bottom: {lanes.map((lane) => lane.name).join(', ')}.
          </p>
        )}
        <div className="relative rounded-md border border-line bg-sunken">
          <div ref={containerRef} data-testid="waveform" aria-label="Waveform of the take; click to move the playhead" />
          {channels > 1 && (
            <ol className="pointer-events-none absolute inset-x-0 top-0" aria-hidden="true">
              {lanes.map((lane, i) => (
                <li
                  key={i}
                  className={`absolute left-1 rounded px-1 text-xs font-semibold ${lane.silent ? 'bg-surface text-fail' : 'bg-surface/80 text-muted'}`}
                  style={{ top: i * laneHeight(channels) + 2 }}
                  data-testid="lane-name"
                >
                  {lane.name}
                  {lane.silent && ' · silent, no programme'}
                </li>
              ))}
            </ol>
          )}
          <div ref={timelineRef} aria-hidden="true" />
        </div>
        {!ready && !failure && <p className="mt-2 text-sm text-muted">Drawing the waveform…</p>}
        <p className="mt-2 text-xs text-muted">
          Keys: <kbd>Space</kbd> play or pause · <kbd>←</kbd> <kbd>→</kbd> previous or next finding, then the previous or next take. Time axis in minutes:seconds.
        </p>
      </section>
      <div className="min-w-0 space-y-4">
        <FindingsList markers={markers} selected={selected} onPick={(index) => goTo(index, true)} />
        {untimed.length > 0 && (
          <section className="tp-card p-4" aria-labelledby="untimed-heading">
            <h2 id="untimed-heading" className="text-lg font-semibold">
              Findings for the whole take
            </h2>
            <ul className="mt-2 space-y-1.5 text-sm" data-testid="untimed-findings">
              {untimed.map((f, i) => (
                <li key={i} className="flex gap-2">
                  <SeverityMark severity={f.severity} />
                  <span>
                    <span className="font-semibold">{CHECK_LABEL[f.check]}:</span> {f.summary ?? f.message}
                  </span>
                </li>
              ))}
            </ul>
          </section>
        )}
      </div>
    </div>
  );
}
