'use client';

import { useImperativeHandle, useState, type Ref } from 'react';
import { channelShortName, formatClock } from '@/lib/format';
import { cueTime, stepMarker, type TimedMarker } from '@/lib/review/reportView';
import type { TakeCommentView } from '@/lib/review/views';
import { FindingsList } from './FindingsList';
import { usePeaks } from './usePeaks';
import { usePlayerKeys } from './usePlayerKeys';
import { useThemeColors } from './useThemeColors';
import { useWaveform, ZOOM_STEPS } from './useWaveform';

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
  markers: TimedMarker[];
  comments: TakeCommentView[];
  caution: string | null;
  /** Called with the playhead time whenever it moves (the comment form uses it). */
  onTime?: (seconds: number) => void;
  ref?: Ref<PlayerHandle>;
}

/** The waveform with its marked regions, transport and zoom, and the list of timed findings. */
export function TakeWorkspace({ takeId, durationSec, channels, markers, comments, caution, onTime, ref }: WorkspaceProps) {
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
          <div ref={containerRef} data-testid="waveform" aria-label="Waveform of the take; click to move the playhead" />
          <div ref={timelineRef} aria-hidden="true" />
        </div>
        {!ready && !failure && <p className="mt-2 text-sm text-muted">Drawing the waveform…</p>}
        <p className="mt-2 text-xs text-muted">
          Keys: <kbd>Space</kbd> play or pause · <kbd>←</kbd> <kbd>→</kbd> previous or next finding. Time axis in minutes:seconds.
        </p>
      </section>
      <FindingsList markers={markers} selected={selected} onPick={(index) => goTo(index, true)} />
    </div>
  );
}
