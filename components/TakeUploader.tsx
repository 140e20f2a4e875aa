'use client';

import { useRef, useState } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import * as tus from 'tus-js-client';
import { cleanFileName, formatBytes } from '@/lib/format';
import { fileRefusal } from '@/lib/takes/fileCheck';
import type { TakeSummary } from '@/lib/takes/views';
import type { Option } from './SessionCreateForm';
import { TakeStatusMark, VerdictMark } from './StatusMarks';
import { TAKE_STATUS } from '@/lib/status';

interface Upload {
  id: number;
  file: File;
  /** Bytes of the file sent so far (the multipart framing around it not counted). */
  sent: number;
  startedAt: number;
  state: 'checking' | 'sending' | 'done' | 'failed' | 'cancelled';
  takeId?: number;
  message?: string;
  cancel?: () => void;
}

let nextUploadId = 1;

function timeLeft(u: Upload): string {
  const elapsed = (Date.now() - u.startedAt) / 1000;
  if (u.sent === 0 || elapsed < 0.5) return '';
  const rate = u.sent / elapsed;
  const rest = (u.file.size - u.sent) / rate;
  return `${formatBytes(rate)}/s · ${rest < 60 ? `${Math.ceil(rest)} s` : `${Math.ceil(rest / 60)} min`} left`;
}

/** Files from this size on go up as resumable (tus) uploads, in parts of RESUMABLE_PART_BYTES. */
const RESUMABLE_FROM_BYTES = 64 * 1024 * 1024;
const RESUMABLE_PART_BYTES = 64 * 1024 * 1024;
/** How long a resumable upload waits before each new try after a dropped connection, ms. */
const RETRY_DELAYS = [0, 1000, 3000, 5000, 10_000, 30_000, 60_000];

function messageOf(error: Error): string {
  const body = (error as tus.DetailedError).originalResponse?.getBody();
  try {
    return (JSON.parse(body ?? '') as { message?: string }).message ?? error.message;
  } catch {
    return 'The connection dropped and did not come back. Choose the same file again to continue where it stopped.';
  }
}

/** The new take's id from an upload's answer (`{ takes: [{ id }] }`, as an object or as JSON text). */
function takeIdOf(answer: unknown): number | undefined {
  try {
    const body = (typeof answer === 'string' ? JSON.parse(answer) : answer) as { takes?: { id: number }[] } | null;
    return body?.takes?.[0]?.id;
  } catch {
    return undefined;
  }
}

/**
 * Drop zone and file picker for many WAV takes at once. Each file goes up in its own request
 * (XMLHttpRequest, because fetch cannot report upload progress) with its own bar and cancel button.
 */
export function TakeUploader({ sessionId, recorders, takesKey, maxBytes }: { sessionId: number; recorders: Option[]; takesKey: string; maxBytes: number }) {
  const { mutate } = useSWRConfig();
  // The same list the take table polls: an upload's line follows its take once it is stored.
  const { data: listed } = useSWR<{ takes: TakeSummary[] }>(takesKey);
  const [uploads, setUploads] = useState<Upload[]>([]);
  const [dragging, setDragging] = useState(false);
  const [recorderId, setRecorderId] = useState('');
  const input = useRef<HTMLInputElement>(null);

  const patch = (id: number, change: Partial<Upload>) => setUploads((all) => all.map((u) => (u.id === id ? { ...u, ...change } : u)));

  function start(files: FileList | File[]) {
    for (const file of Array.from(files)) {
      const upload: Upload = { id: nextUploadId++, file, sent: 0, startedAt: 0, state: 'checking' };
      setUploads((all) => [upload, ...all]);
      void fileRefusal(file, maxBytes).then((refusal) => {
        if (refusal) patch(upload.id, { state: 'failed', message: refusal });
        else if (file.size >= RESUMABLE_FROM_BYTES) startResumable(upload);
        else send(upload);
      });
    }
  }

  /**
   * A large file goes up with the tus protocol: a dropped connection is retried from the last byte the
   * server holds, and choosing the same file again after a reload continues the earlier upload.
   */
  function startResumable(upload: Upload) {
    const { file } = upload;
    patch(upload.id, { state: 'sending', startedAt: Date.now() });
    const resumable = new tus.Upload(file, {
      endpoint: `/api/sessions/${sessionId}/uploads`,
      chunkSize: RESUMABLE_PART_BYTES,
      retryDelays: RETRY_DELAYS,
      removeFingerprintOnSuccess: true,
      metadata: { filename: cleanFileName(file.name), ...(recorderId ? { recorderId } : {}) },
      onProgress: (sent) => patch(upload.id, { sent }),
      onSuccess: ({ lastResponse }) => {
        patch(upload.id, { state: 'done', sent: file.size, takeId: takeIdOf(lastResponse.getBody()) });
        void mutate(takesKey);
      },
      onError: (error) => patch(upload.id, { state: 'failed', message: messageOf(error) }),
    });
    upload.cancel = () => {
      void resumable.abort(true);
      patch(upload.id, { state: 'cancelled', message: 'Cancelled. Nothing was kept.' });
    };
    void resumable.findPreviousUploads().then((previous) => {
      if (previous.length > 0) resumable.resumeFromPreviousUpload(previous[0]);
      resumable.start();
    });
  }

  function send(upload: Upload) {
    const { file } = upload;
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/sessions/${sessionId}/takes`);
    xhr.responseType = 'json';
    // `loaded` counts the multipart framing too: scale it to the file's own bytes.
    xhr.upload.onprogress = (e) => patch(upload.id, { sent: e.total ? Math.min(file.size, Math.round((file.size * e.loaded) / e.total)) : 0 });
    xhr.onload = () => {
      if (xhr.status === 201) {
        const takeId = takeIdOf(xhr.response);
        patch(upload.id, { state: 'done', sent: file.size, takeId });
        void mutate(takesKey);
      } else {
        const message = (xhr.response as { message?: string } | null)?.message ?? `The server answered ${xhr.status}.`;
        patch(upload.id, { state: 'failed', message });
      }
    };
    xhr.onerror = () => patch(upload.id, { state: 'failed', message: 'The connection dropped. Nothing was kept; try again.' });
    xhr.onabort = () => patch(upload.id, { state: 'cancelled', message: 'Cancelled. Nothing was kept.' });
    const form = new FormData();
    if (recorderId) form.append('recorderId', recorderId);
    // Multipart headers may not carry control characters, which some file systems allow in names.
    form.append('file', file, cleanFileName(file.name));
    upload.cancel = () => xhr.abort();
    patch(upload.id, { state: 'sending', startedAt: Date.now() });
    xhr.send(form);
  }

  return (
    <section aria-labelledby="upload-heading" className="tp-card p-4">
      <div className="mb-3 flex flex-wrap items-end gap-4">
        <h2 id="upload-heading" className="mr-auto text-lg font-semibold">
          Add takes
        </h2>
        <label className="text-sm">
          <span className="tp-label">Recorder</span>
          <select className="tp-input" value={recorderId} onChange={(e) => setRecorderId(e.target.value)}>
            <option value="">Match from the file’s BWF data</option>
            {recorders.map((r) => (
              <option key={r.id} value={r.id}>
                {r.name}
              </option>
            ))}
          </select>
        </label>
      </div>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDragging(false);
          start(e.dataTransfer.files);
        }}
        className={`flex flex-col items-center justify-center gap-2 rounded-card border-2 border-dashed p-6 text-center ${dragging ? 'border-accent bg-sunken' : 'border-line'}`}
      >
        <p className="font-semibold">Drop WAV takes here</p>
        <p className="text-sm text-muted">or</p>
        <button type="button" className="tp-button" onClick={() => input.current?.click()}>
          Choose files…
        </button>
        <input
          ref={input}
          type="file"
          accept=".wav,.bwf,audio/wav,audio/x-wav"
          multiple
          className="sr-only"
          tabIndex={-1}
          aria-hidden="true"
          aria-label="Choose WAV files to upload"
          data-testid="take-file-input"
          onChange={(e) => {
            if (e.target.files) start(e.target.files);
            e.target.value = '';
          }}
        />
      </div>
      {uploads.length > 0 && (
        <ul className="mt-3 space-y-2" aria-label="Uploads">
          {uploads.map((u) => {
            const pct = u.file.size ? Math.round((100 * u.sent) / u.file.size) : 100;
            return (
              <li key={u.id} className="rounded-md border border-line p-2 text-sm">
                <div className="flex items-center gap-3">
                  <span className="min-w-0 flex-1 truncate font-semibold" title={u.file.name}>
                    {u.file.name}
                  </span>
                  <span className="font-mono text-xs text-muted">
                    {formatBytes(u.sent)} / {formatBytes(u.file.size)}
                  </span>
                  {u.state === 'sending' && (
                    <button type="button" className="tp-button-quiet px-2 py-1" onClick={() => u.cancel?.()} aria-label={`Cancel upload of ${u.file.name}`}>
                      Cancel
                    </button>
                  )}
                </div>
                <div className="mt-1 h-1.5 overflow-hidden rounded bg-sunken" role="progressbar" aria-label={`Upload of ${u.file.name}`} aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100}>
                  <div className={`h-full ${u.state === 'failed' ? 'bg-fail' : 'bg-accent'}`} style={{ width: `${pct}%` }} />
                </div>
                <p className="mt-1 text-xs">
                  {u.state === 'sending' && <span className="text-muted">Sending… {pct} % {timeLeft(u)}</span>}
                  {u.state === 'checking' && <span className="text-muted">Checking the file…</span>}
                  {u.state === 'done' && <UploadedTake take={listed?.takes.find((t) => t.id === u.takeId)} />}
                  {u.state === 'failed' && <span className="text-fail">✕ {u.message}</span>}
                  {u.state === 'cancelled' && <span className="text-muted">○ {u.message}</span>}
                </p>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}

/** An uploaded file's line once its take exists: live measuring status, then verdict and reason. */
function UploadedTake({ take }: { take: TakeSummary | undefined }) {
  if (!take || take.status === 'queued') return <span className="text-muted">{TAKE_STATUS.queued.mark} Uploaded — waiting to be measured</span>;
  if (take.status !== 'measured') return <TakeStatusMark status={take.status} progress={take.progress} error={take.error} />;
  return (
    <span className="inline-flex flex-wrap items-center gap-x-2">
      <VerdictMark verdict={take.verdict} />
      {take.reason && <span>{take.reason}</span>}
    </span>
  );
}
