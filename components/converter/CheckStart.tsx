'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { cleanFileName, formatBytes } from '@/lib/format';
import type { ConverterCheckSummary, SignalFormatView } from '@/lib/converterChecks/views';
import { FormMessage } from '../FormMessage';
import { PlaybackCaution } from './PlaybackCaution';

const RATES = [32_000, 44_100, 48_000, 88_200, 96_000, 176_400, 192_000];

/**
 * "Check the converter": 1. download the check signal at the recorder's usual format (or another),
 * 2. play it through the recorder's line inputs and record it, 3. upload the recording. The upload
 * goes up with XMLHttpRequest for its progress; the result page opens when it is received.
 */
export function CheckStart({ recorderId, usualFormat, active }: { recorderId: number; usualFormat: SignalFormatView & { basis: 'takes' | 'default' }; active: boolean }) {
  const router = useRouter();
  const [format, setFormat] = useState({ rate: String(usualFormat.sampleRate), bits: String(usualFormat.bitsPerSample), channels: String(usualFormat.channels) });
  const [sent, setSent] = useState<{ loaded: number; total: number } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const query = new URLSearchParams(format).toString();

  function upload(file: File) {
    setError(null);
    setSent({ loaded: 0, total: file.size });
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/recorders/${recorderId}/converter-checks`);
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => setSent({ loaded: e.loaded, total: file.size });
    xhr.onload = () => {
      if (xhr.status === 201) {
        router.push(`/converter-checks/${(xhr.response as ConverterCheckSummary).id}`);
        return;
      }
      setSent(null);
      setError((xhr.response as { message?: string } | null)?.message ?? `The server answered ${xhr.status}.`);
    };
    xhr.onerror = () => {
      setSent(null);
      setError('The connection dropped. Nothing was kept; try again.');
    };
    const form = new FormData();
    form.append('file', file, cleanFileName(file.name));
    xhr.send(form);
  }

  return (
    <section className="tp-card p-4" aria-labelledby="check-start">
      <h2 id="check-start" className="mb-3 text-lg font-semibold">
        Check the converter
      </h2>
      <PlaybackCaution />
      <ol className="mt-4 grid gap-5">
        <li>
          <h3 className="font-semibold">1. Download the check signal</h3>
          <p className="mb-2 text-sm text-muted">
            {usualFormat.basis === 'takes' ? 'Preset to the format most of this recorder’s takes use.' : 'This recorder has no measured takes yet: preset to 48 kHz, 24 bits, stereo.'} About 30 seconds
            long (a minute for 16 channels).
          </p>
          <div className="flex flex-wrap items-end gap-3">
            <label className="text-sm">
              <span className="tp-label">Sample rate</span>
              <select className="tp-input" value={format.rate} onChange={(e) => setFormat({ ...format, rate: e.target.value })}>
                {RATES.map((r) => (
                  <option key={r} value={r}>
                    {(r / 1000).toLocaleString('en', { maximumFractionDigits: 1 })} kHz
                  </option>
                ))}
              </select>
            </label>
            <label className="text-sm">
              <span className="tp-label">Bit depth</span>
              <select className="tp-input" value={format.bits} onChange={(e) => setFormat({ ...format, bits: e.target.value })}>
                {['16', '24', '32'].map((b) => (
                  <option key={b} value={b}>
                    {b} bits
                  </option>
                ))}
              </select>
            </label>
            <label className="text-sm">
              <span className="tp-label">Channels</span>
              <select className="tp-input" value={format.channels} onChange={(e) => setFormat({ ...format, channels: e.target.value })}>
                {Array.from({ length: 16 }, (_, i) => String(i + 1)).map((c) => (
                  <option key={c} value={c}>
                    {c}
                  </option>
                ))}
              </select>
            </label>
            <a href={`/api/recorders/${recorderId}/converter-signal?${query}`} className="tp-button" download>
              Download the check signal
            </a>
          </div>
        </li>
        <li>
          <h3 className="font-semibold">2. Play it through the recorder and record it</h3>
          <p className="text-sm text-muted">
            Connect the player’s outputs to the recorder’s line inputs, one output per input in order. Set the input gain so the signal does not reach full scale, start recording, play
            the whole file, and stop a few seconds after it ends. Silence before and after does no harm.
          </p>
        </li>
        <li>
          <h3 className="font-semibold">3. Upload the recording</h3>
          {active ? (
            <label className="mt-2 block text-sm">
              <span className="tp-label">Recording (WAV)</span>
              <input
                type="file"
                accept=".wav,.bwf,audio/wav,audio/x-wav"
                className="tp-input"
                disabled={sent !== null}
                onChange={(e) => {
                  const file = e.currentTarget.files?.[0];
                  if (file) upload(file);
                }}
              />
            </label>
          ) : (
            <p className="text-sm text-muted">This recorder is retired. Reinstate it to check its converter.</p>
          )}
          {sent && (
            <p role="status" className="mt-2 text-sm">
              Uploading… {formatBytes(sent.loaded)} of {formatBytes(sent.total)}
            </p>
          )}
          <FormMessage error={error} className="mt-2" />
        </li>
      </ol>
    </section>
  );
}
