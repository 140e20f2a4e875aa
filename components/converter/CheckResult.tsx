'use client';

import Link from 'next/link';
import useSWR from 'swr';
import type { ConverterFinding } from '@/dsp/converter/report';
import { channelFigures, comparable, wholeCheckFigures } from '@/lib/converterChecks/figures';
import { LEVEL_REFERENCE_NOTE, isAcceptable, type ConverterCheckDetail } from '@/lib/converterChecks/views';
import { fetchJson, type ApiError } from '@/lib/http/fetcher';
import { converterCheckKey } from '@/lib/http/swrKeys';
import { channelName, describeFormat, formatDateTime } from '@/lib/format';
import { FormMessage } from '../FormMessage';
import { SeverityMark } from '../review/marks';
import { useApiForm } from '../useApiForm';
import { CheckStateMark } from './CheckStateMark';
import { FigureTable } from './FigureTable';
import { PlaybackCaution } from './PlaybackCaution';
import { ResponsePlot } from './ResponsePlot';

const BASIS_WORD: Record<ConverterFinding['basis'], string> = { threshold: 'Limit', baseline: 'Against the baseline', check: 'How the check was made' };

function Findings({ findings, count }: { findings: ConverterFinding[]; count: number }) {
  return (
    <section className="tp-card p-4" aria-labelledby="findings-heading">
      <h2 id="findings-heading" className="mb-2 text-lg font-semibold">
        Findings
      </h2>
      {findings.length === 0 ? (
        <p className="text-muted">
          <span aria-hidden="true">✓ </span>Every figure is within its limit and none moved beyond its threshold since the baseline.
        </p>
      ) : (
        <ul className="space-y-2" data-testid="converter-findings">
          {findings.map((f, i) => (
            <li key={i} className="flex gap-3 text-sm" data-check={f.check} data-basis={f.basis}>
              <SeverityMark severity={f.severity} />
              <span>
                {f.message}
                <span className="block text-xs text-muted">
                  {BASIS_WORD[f.basis]}
                  {f.channel !== undefined ? ` · ${channelName(f.channel, count)}` : ''}
                </span>
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

/** The result page of a converter check: refreshes until it is measured, then shows every figure against the baseline and the limits. */
export function CheckResult({ checkId, manages }: { checkId: number; manages: boolean }) {
  const { data: check, error, mutate } = useSWR<ConverterCheckDetail, ApiError>(converterCheckKey(checkId), {
    // Nothing in the cache yet (the page's fallback is not passed here) counts as still measuring.
    refreshInterval: (latest) => (!latest || latest.status === 'queued' || latest.status === 'measuring' ? 2000 : 0),
  });
  const baselineAction = useApiForm();
  if (error) return <FormMessage error={error.message} />;
  if (!check) return <p className="text-muted">Loading the check…</p>;
  const report = check.report;
  const baseline = check.baseline && report && comparable(report, check.baseline.report) ? check.baseline.report : null;
  const count = report?.channels.length ?? 0;
  const columns = report ? report.channels.map((_c, i) => channelName(i, count)) : [];

  async function makeBaseline() {
    await baselineAction.run(async () => {
      await fetchJson(`/api/converter-checks/${checkId}/baseline`, { method: 'POST' });
      await mutate();
      return 'This check is now the baseline; the recorder’s checks were judged again against it.';
    });
  }

  return (
    <article className="grid gap-6">
      <header>
        <p className="mb-2 text-sm">
          <Link href={`/recorders/${check.recorderId}/converter`} className="text-accent hover:underline">
            ← Converter checks of {check.recorderLabel}
          </Link>
        </p>
        <h1 className="text-2xl font-semibold">Converter check · {check.recorderLabel}</h1>
        <p className="mt-1 flex flex-wrap items-center gap-x-3 text-sm text-muted">
          <span data-testid="check-state">
            <CheckStateMark check={check} />
          </span>
          {check.isBaseline && <span className="font-semibold text-ink">⚑ Baseline</span>}
          <span>{check.measuredAt ? `Measured ${formatDateTime(check.measuredAt)}` : `Uploaded ${formatDateTime(check.uploadedAt)}`}</span>
          {check.format && <span>{describeFormat(check.format)}</span>}
          <span>{check.originalName}</span>
        </p>
      </header>

      {check.status === 'unreadable' && (
        <p role="alert" className="rounded-md border border-fail bg-sunken p-3 text-sm">
          <strong className="text-fail">✕ Not measured.</strong> {check.error}
        </p>
      )}
      {(check.status === 'queued' || check.status === 'measuring') && (
        <p role="status" className="text-muted">
          The recording is being measured; this page updates by itself.
        </p>
      )}

      {report && (
        <>
          <p className="max-w-prose text-sm" data-testid="level-reference">
            <strong>Level reference.</strong> {LEVEL_REFERENCE_NOTE}
          </p>
          <Findings findings={report.findings} count={count} />
          {manages && !check.isBaseline && isAcceptable(report.findings) && (
            <div className="flex flex-wrap items-center gap-3">
              <button type="button" className="tp-button-quiet" disabled={baselineAction.busy} onClick={() => void makeBaseline()}>
                Make this check the baseline
              </button>
              <span className="text-sm text-muted">
                {check.baseline?.measuredAt ? `The baseline now is the check of ${formatDateTime(check.baseline.measuredAt)}.` : 'This recorder has no baseline yet.'}
              </span>
              <FormMessage error={baselineAction.error} notice={baselineAction.notice} inline />
            </div>
          )}
          {check.isBaseline && <FormMessage notice={baselineAction.notice} />}
          <ResponsePlot report={report} baseline={baseline} />
          <section className="tp-card" aria-labelledby="channels-heading">
            <h2 id="channels-heading" className="border-b border-line p-4 text-lg font-semibold">
              Per channel
            </h2>
            <FigureTable caption="Figures per channel, with the baseline and the limit" columns={columns} rows={channelFigures(report, baseline, check.thresholds)} />
          </section>
          <section className="tp-card" aria-labelledby="whole-heading">
            <h2 id="whole-heading" className="border-b border-line p-4 text-lg font-semibold">
              Whole check
            </h2>
            <FigureTable caption="Figures of the whole check, with the baseline and the limit" columns={['Value']} rows={wholeCheckFigures(report, baseline, check.thresholds)} />
          </section>
          <p className="text-sm text-muted">
            {check.isBaseline
              ? 'This check is the baseline: later checks are compared with it.'
              : baseline
                ? `Compared with the baseline check of ${check.baseline?.measuredAt ? formatDateTime(check.baseline.measuredAt) : '—'}.`
                : check.baseline
                  ? 'The baseline was recorded at another sample rate or channel count, so it is not compared.'
                  : 'No baseline to compare with yet.'}{' '}
            Limits are {check.thresholdsAreDefault ? 'Takeproof’s starting values (common practice, not a standard)' : `the studio’s own for ${check.recorderMakeModel}`}; the studio’s
            own specifications take precedence. THD+N and dynamic range are measured 20 Hz – 20 kHz (AES17); SINAD and effective bits over the whole band (IEEE 1241).
          </p>
        </>
      )}
      <PlaybackCaution />
    </article>
  );
}
