'use client';

import Link from 'next/link';
import { useCallback, useMemo, useRef, useState } from 'react';
import useSWR from 'swr';
import type { DeliverySpec } from '@/dsp/spec';
import { DecisionMark, VerdictMark } from '@/components/StatusMarks';
import { TakeActions } from '@/components/TakeActions';
import { can, mayRemoveTake } from '@/lib/auth/policy';
import type { Role } from '@/models/User';
import { channelShortName, describeFormat, formatBytes, formatDuration } from '@/lib/format';
import { hearingCaution, timedMarkers, untimedFindings } from '@/lib/review/reportView';
import { takeCommentsKey, takeKey } from '@/lib/http/swrKeys';
import type { TakeDetail } from '@/lib/takes/views';
import { CommentsPanel } from './CommentsPanel';
import { DecisionPanel } from './DecisionPanel';
import { MeasuresPanel } from './MeasuresPanel';
import { LoudnessPlot, SpectrumPlot } from './Plots';
import { TakeWorkspace, type PlayerHandle } from './TakeWorkspace';
import { useTakeStepKeys } from './useTakeStepKeys';
import type { TakeCommentView } from '@/lib/review/views';
import { TAKE_STATUS } from '@/lib/status';

export interface Neighbours {
  previous: { id: number; name: string } | null;
  next: { id: number; name: string } | null;
  position: number;
  count: number;
}

const busy = (t: TakeDetail | undefined) => !!t && (t.status === 'queued' || t.status === 'measuring');

/** The review page of one take: live while it is measured, then waveform, findings, measures, plots, decision, comments. */
export function TakeReview({
  takeId,
  session,
  spec,
  neighbours,
  canDecide,
  canComment,
  viewer,
  maxUploadBytes,
}: {
  takeId: number;
  session: { id: number; title: string };
  spec: DeliverySpec;
  neighbours: Neighbours;
  canDecide: boolean;
  canComment: boolean;
  viewer: { id: number; role: Role };
  /** The studio's largest accepted file, bytes (for Replace file). */
  maxUploadBytes: number;
}) {
  const { data: take, mutate } = useSWR<TakeDetail>(takeKey(takeId), { refreshInterval: (latest) => (busy(latest) ? 1500 : 0) });
  const { data: commentData, mutate: mutateComments } = useSWR<{ comments: TakeCommentView[] }>(takeCommentsKey(takeId));
  const [playhead, setPlayhead] = useState(0);
  const playerRef = useRef<PlayerHandle>(null);
  const report = take?.status === 'measured' ? take.report : null;
  const markers = useMemo(() => (report ? timedMarkers(report) : []), [report]);
  const caution = useMemo(() => hearingCaution(report), [report]);
  const untimed = useMemo(() => (report ? untimedFindings(report) : []), [report]);
  const comments = useMemo(() => commentData?.comments ?? [], [commentData]);
  const onTime = useCallback((t: number) => setPlayhead(t), []);
  useTakeStepKeys(neighbours.previous && `/takes/${neighbours.previous.id}`, neighbours.next && `/takes/${neighbours.next.id}`);

  if (!take) return <p className="text-muted">Loading the take…</p>;
  const actions = (
    <div className="mt-2">
      <TakeActions
        take={take}
        canRemeasure={can(viewer.role, 'take:remeasure')}
        canRemove={mayRemoveTake(viewer, take)}
        replace={can(viewer.role, 'take:upload') ? { maxBytes: maxUploadBytes } : undefined}
        onChanged={() => void mutate()}
        leaveTo={`/sessions/${session.id}`}
      />
    </div>
  );

  return (
    <article className="space-y-4">
      <nav aria-label="Takes in this session" className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm">
        <Link href={`/sessions/${session.id}`} className="text-accent hover:underline">
          ← {session.title}
        </Link>
        <span className="text-muted">
          Take {neighbours.position} of {neighbours.count}
        </span>
        <span className="ml-auto flex gap-2">
          {neighbours.previous ? (
            <Link href={`/takes/${neighbours.previous.id}`} className="tp-button-quiet" rel="prev" title={neighbours.previous.name} aria-keyshortcuts="ArrowLeft">
              ‹ Previous take
            </Link>
          ) : (
            <span className="tp-button-quiet opacity-50" aria-disabled="true">‹ Previous take</span>
          )}
          {neighbours.next ? (
            <Link href={`/takes/${neighbours.next.id}`} className="tp-button-quiet" rel="next" title={neighbours.next.name} aria-keyshortcuts="ArrowRight">
              Next take ›
            </Link>
          ) : (
            <span className="tp-button-quiet opacity-50" aria-disabled="true">Next take ›</span>
          )}
        </span>
      </nav>

      <header>
        <h1 className="break-all text-2xl font-semibold">{take.originalName}</h1>
        <p className="mt-1 flex flex-wrap gap-x-5 gap-y-1 text-sm text-muted">
          <span>
            Verdict: <VerdictMark verdict={take.verdict} />
          </span>
          <span>
            Decision: <DecisionMark decision={take.decision} />
          </span>
          {take.reason && (
            <span className="basis-full text-base text-ink" data-testid="verdict-reason">
              Why: {take.reason}
            </span>
          )}
          <span className="font-mono">{describeFormat(take.format)}</span>
          <span className="font-mono">{formatDuration(take.durationSec)}</span>
          <span className="font-mono">{formatBytes(take.bytes)}</span>
          {take.recorderLabel && <span>Recorder: {take.recorderLabel}</span>}
          <a href={`/api/takes/${take.id}/audio?download=1`} className="text-accent hover:underline">
            Download the WAV
          </a>
        </p>
        {take.status !== 'unreadable' && actions}
      </header>

      {busy(take) && (
        <section className="tp-card p-6" role="status" data-testid="measuring">
          <p className="text-lg font-semibold">
            {take.status === 'queued' ? `${TAKE_STATUS.queued.mark} Waiting to be measured` : `${TAKE_STATUS.measuring.mark} Still measuring — ${Math.round(take.progress)} %`}
          </p>
          <div className="mt-3 h-2 w-full max-w-md overflow-hidden rounded bg-sunken" role="progressbar" aria-valuenow={Math.round(take.progress)} aria-valuemin={0} aria-valuemax={100} aria-label="Measuring">
            <div className="h-full bg-accent transition-[width]" style={{ width: `${take.progress}%` }} />
          </div>
          <p className="mt-2 text-sm text-muted">This page fills in by itself when the measurement is done.</p>
        </section>
      )}

      {take.status === 'unreadable' && (
        <section className="tp-card p-6" role="alert" data-testid="unreadable">
          <p className="text-lg font-semibold text-fail">
            <span aria-hidden="true">✕ </span>This file could not be read: {take.error ?? 'no reason was recorded.'}
          </p>
          <p className="mt-2 text-sm text-muted">Measure it again, or remove it and upload the file once more.</p>
          <div className="mt-3">{actions}</div>
        </section>
      )}

      {report && (
        <>
          <TakeWorkspace
            takeId={take.id}
            durationSec={take.durationSec ?? report.file.durationSec}
            channels={report.file.channels}
            lanes={report.channels.map((c, i) => ({ name: c.name ?? channelShortName(i, report.file.channels), silent: c.silent }))}
            markers={markers}
            untimed={untimed}
            comments={comments}
            caution={caution}
            onTime={onTime}
            ref={playerRef}
          />
          <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_24rem]">
            <div className="min-w-0 space-y-4">
              <MeasuresPanel report={report} spec={spec} />
              <section className="tp-card p-4" aria-labelledby="plots-heading">
                <h2 id="plots-heading" className="text-lg font-semibold">
                  Spectrum and loudness
                </h2>
                {report.bandwidth.spectrum ? (
                  <>
                    <h3 className="mt-3 text-sm font-semibold">Long-term spectrum</h3>
                    <SpectrumPlot hz={report.bandwidth.spectrum.hz} db={report.bandwidth.spectrum.db} nyquistHz={report.file.sampleRate / 2} effectiveHz={report.bandwidth.effectiveHz} />
                  </>
                ) : (
                  <p className="mt-2 text-sm text-muted">This report holds no spectrum; measure the take again to draw one.</p>
                )}
                {report.loudness.shortTermSeries && report.loudness.shortTermSeries.values.some((v) => v != null) ? (
                  <>
                    <h3 className="mt-4 text-sm font-semibold">Short-term loudness over time</h3>
                    <LoudnessPlot
                      stepSec={report.loudness.shortTermSeries.stepSec}
                      values={report.loudness.shortTermSeries.values}
                      targetLufs={spec.loudnessTargetLufs}
                      toleranceLu={spec.loudnessToleranceLu}
                      integratedLufs={report.loudness.integratedLufs}
                    />
                  </>
                ) : (
                  <p className="mt-2 text-sm text-muted">The take is too short or too quiet for a loudness curve.</p>
                )}
              </section>
            </div>
            <div className="space-y-4">
              <DecisionPanel take={take} canDecide={canDecide} onDecided={(updated) => void mutate(updated, { revalidate: false })} />
              <CommentsPanel takeId={take.id} comments={comments} playhead={playhead} canComment={canComment} onAdded={() => void mutateComments()} onSeek={(t) => playerRef.current?.seek(t, false)} />
            </div>
          </div>
        </>
      )}

      {!report && take.status !== 'measured' && (
        <div className="grid gap-4 lg:grid-cols-2">
          <DecisionPanel take={take} canDecide={canDecide} onDecided={(updated) => void mutate(updated, { revalidate: false })} />
          <CommentsPanel takeId={take.id} comments={comments} playhead={0} canComment={canComment} onAdded={() => void mutateComments()} onSeek={() => undefined} />
        </div>
      )}
    </article>
  );
}
