'use client';

import Link from 'next/link';
import { useMemo, useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/http/fetcher';
import { describeFormat, formatDuration, formatMeasure } from '@/lib/format';
import { MEASURE } from '@/lib/glossary';
import { DECISION_STATUS, TAKE_STATUS, VERDICT_STATUS } from '@/lib/status';
import { worstFirst } from '@/lib/takes/order';
import type { TakeSummary } from '@/lib/takes/views';
import { DecisionMark, StatusMark, TakeStatusMark, VerdictMark } from './StatusMarks';
import { FormMessage } from './FormMessage';
import { TakeActions } from './TakeActions';
import { can, mayRemoveTake } from '@/lib/auth/policy';
import type { Role } from '@/models/User';

type SortKey = 'originalName' | 'recorderLabel' | 'durationSec' | 'effectiveBits' | 'truePeakDbtp' | 'integratedLufs' | 'noiseFloorDbfs' | 'clipEvents' | 'verdict' | 'decision';

const COLUMNS: { key: SortKey; label: string; numeric?: boolean }[] = [
  { key: 'originalName', label: 'Take' },
  { key: 'recorderLabel', label: 'Recorder' },
  { key: 'durationSec', label: MEASURE.duration.label, numeric: true },
  { key: 'effectiveBits', label: MEASURE.effectiveBits.label, numeric: true },
  { key: 'truePeakDbtp', label: MEASURE.truePeak.label, numeric: true },
  { key: 'integratedLufs', label: MEASURE.integratedLoudness.label, numeric: true },
  { key: 'noiseFloorDbfs', label: MEASURE.noiseFloor.label, numeric: true },
  { key: 'clipEvents', label: MEASURE.clipEvents.label, numeric: true },
  { key: 'verdict', label: 'Verdict' },
  { key: 'decision', label: 'Decision' },
];

function compare(a: TakeSummary, b: TakeSummary, key: SortKey): number {
  if (key === 'verdict') return worstFirst(a, b);
  const va = a[key];
  const vb = b[key];
  if (va == null && vb == null) return 0;
  if (va == null) return 1;
  if (vb == null) return -1;
  return typeof va === 'number' && typeof vb === 'number' ? va - vb : String(va).localeCompare(String(vb));
}

/** The session's takes, sortable and filterable; polls while any take is still being measured. */
export function TakeTable({ takesKey, viewer }: { takesKey: string; viewer: { id: number; role: Role } }) {
  const { data, error, mutate } = useSWR<{ takes: TakeSummary[] }, ApiError>(takesKey, {
    refreshInterval: (latest) => (latest?.takes.some((t) => t.status === 'queued' || t.status === 'measuring') ? 1500 : 0),
  });
  const [sort, setSort] = useState<{ key: SortKey; descending: boolean }>({ key: 'verdict', descending: false });
  const [filter, setFilter] = useState({ text: '', verdict: 'all', decision: 'all' });
  const takes = useMemo(() => data?.takes ?? [], [data]);

  const shown = useMemo(() => {
    const text = filter.text.trim().toLowerCase();
    const rows = takes.filter(
      (t) =>
        (!text || t.originalName.toLowerCase().includes(text) || (t.recorderLabel ?? '').toLowerCase().includes(text)) &&
        (filter.verdict === 'all' || t.verdict === filter.verdict) &&
        (filter.decision === 'all' || t.decision === filter.decision),
    );
    rows.sort((a, b) => compare(a, b, sort.key) * (sort.descending ? -1 : 1) || worstFirst(a, b));
    return rows;
  }, [takes, filter, sort]);

  const counts = {
    pass: takes.filter((t) => t.verdict === 'pass').length,
    warn: takes.filter((t) => t.verdict === 'warn').length,
    fail: takes.filter((t) => t.verdict === 'fail').length,
    approved: takes.filter((t) => t.decision === 'approved').length,
    rejected: takes.filter((t) => t.decision === 'rejected').length,
    waiting: takes.filter((t) => t.status === 'queued' || t.status === 'measuring').length,
  };

  return (
    <section aria-labelledby="takes-heading" className="tp-card">
      <div className="flex flex-wrap items-end gap-3 border-b border-line p-4">
        <h2 id="takes-heading" className="mr-auto text-lg font-semibold">
          Takes
        </h2>
        <label className="text-sm">
          <span className="tp-label">Find</span>
          <input className="tp-input w-44" type="search" value={filter.text} onChange={(e) => setFilter({ ...filter, text: e.target.value })} placeholder="Name or recorder" />
        </label>
        <label className="text-sm">
          <span className="tp-label">Verdict</span>
          <select className="tp-input" value={filter.verdict} onChange={(e) => setFilter({ ...filter, verdict: e.target.value })}>
            <option value="all">All</option>
            {(['pass', 'warn', 'fail'] as const).map((v) => (
              <option key={v} value={v}>
                {VERDICT_STATUS[v].word}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="tp-label">Decision</span>
          <select className="tp-input" value={filter.decision} onChange={(e) => setFilter({ ...filter, decision: e.target.value })}>
            <option value="all">All</option>
            {(['pending', 'approved', 'rejected'] as const).map((d) => (
              <option key={d} value={d}>
                {DECISION_STATUS[d].word}
              </option>
            ))}
          </select>
        </label>
      </div>
      {takes.length > 0 && (
        <p className="flex flex-wrap gap-x-5 gap-y-1 border-b border-line bg-sunken px-4 py-2 text-sm" data-testid="take-summary" aria-live="polite">
          <span>{takes.length} takes</span>
          <StatusMark status={VERDICT_STATUS.fail}>{counts.fail} {VERDICT_STATUS.fail.word}</StatusMark>
          <StatusMark status={VERDICT_STATUS.warn}>{counts.warn} {VERDICT_STATUS.warn.word}</StatusMark>
          <StatusMark status={VERDICT_STATUS.pass}>{counts.pass} {VERDICT_STATUS.pass.word}</StatusMark>
          <StatusMark status={DECISION_STATUS.approved}>{counts.approved} {DECISION_STATUS.approved.word}</StatusMark>
          <StatusMark status={DECISION_STATUS.rejected}>{counts.rejected} {DECISION_STATUS.rejected.word}</StatusMark>
          {counts.waiting > 0 && <StatusMark status={TAKE_STATUS.queued}>{counts.waiting} still being measured</StatusMark>}
        </p>
      )}
      <FormMessage error={error?.message} className="p-4" />
      {!error && !data && <p className="p-4 text-muted">Loading takes…</p>}
      {data && takes.length === 0 && <p className="p-6 text-muted">No takes yet. Drop the session’s WAV files into “Add takes”.</p>}
      {takes.length > 0 && shown.length === 0 && <p className="p-6 text-muted">No take matches these filters.</p>}
      {shown.length > 0 && (
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm" aria-describedby="takes-heading">
            <thead className="bg-sunken text-muted">
              <tr>
                {COLUMNS.map((c) => {
                  const active = sort.key === c.key;
                  return (
                    <th key={c.key} scope="col" className={`px-2 py-2 align-bottom font-semibold ${c.numeric ? 'text-right' : ''}`} aria-sort={active ? (sort.descending ? 'descending' : 'ascending') : 'none'}>
                      <button type="button" className={`inline-flex items-end gap-1 hover:text-ink ${c.numeric ? 'text-right' : 'text-left'}`} onClick={() => setSort({ key: c.key, descending: active ? !sort.descending : false })}>
                        {c.label}
                        <span aria-hidden="true">{active ? (sort.descending ? '▼' : '▲') : '↕'}</span>
                      </button>
                    </th>
                  );
                })}
                <th scope="col" className="px-2 py-2 font-semibold">Status</th>
              </tr>
            </thead>
            <tbody>
              {shown.map((t) => (
                <tr key={t.id} className="border-t border-line" data-testid={`take-row-${t.id}`}>
                  <td className="max-w-72 px-2 py-2">
                    <Link href={`/takes/${t.id}`} className="block truncate font-semibold text-accent hover:underline" title={t.originalName}>
                      {t.originalName}
                    </Link>
                    {t.reason && (
                      <span className="block text-xs" data-testid="reason">
                        {t.reason}
                      </span>
                    )}
                    {t.status === 'unreadable' ? (
                      <span className="block text-xs text-fail">{t.error ?? 'The file could not be read.'}</span>
                    ) : (
                      <span className="block whitespace-nowrap text-xs text-muted">{describeFormat(t.format)}</span>
                    )}
                  </td>
                  <td className="px-2 py-2">{t.recorderLabel ?? '—'}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-right font-mono">{formatDuration(t.durationSec)}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-right font-mono">{t.effectiveBits ?? '—'}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-right font-mono">{formatMeasure(t.truePeakDbtp, 1, 'dBTP')}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-right font-mono">{formatMeasure(t.integratedLufs, 1, 'LUFS')}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-right font-mono">{formatMeasure(t.noiseFloorDbfs, 1, 'dBFS')}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-right font-mono">{t.clipEvents ?? '—'}</td>
                  <td className="whitespace-nowrap px-2 py-2" data-testid="verdict"><VerdictMark verdict={t.verdict} /></td>
                  <td className="whitespace-nowrap px-2 py-2" data-testid="decision"><DecisionMark decision={t.decision} /></td>
                  <td className="px-2 py-2" data-testid="status">
                    <TakeStatusMark status={t.status} progress={t.progress} error={t.error} />
                    {t.status === 'unreadable' && (
                      <div className="mt-1">
                        <TakeActions take={t} canRemeasure={can(viewer.role, 'take:remeasure')} canRemove={mayRemoveTake(viewer, t)} onChanged={() => void mutate()} compact />
                      </div>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
