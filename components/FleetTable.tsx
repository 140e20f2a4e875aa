'use client';

import Link from 'next/link';
import { useMemo, useState } from 'react';
import useSWR from 'swr';
import { type ApiError } from '@/lib/http/fetcher';
import { FLEET_PERIODS, PERIOD_LABEL, type FleetPeriod, type FleetRow } from '@/lib/fleet/views';
import { fleetKey } from '@/lib/http/swrKeys';
import { Sparkline } from './Sparkline';
import { FormMessage } from './FormMessage';
import { LastCheckCell } from './converter/LastCheckCell';
import { formatMeasure } from '@/lib/format';
import { StatusMark } from './StatusMarks';
import { ALERT_STATUS, RECORDER_STATUS, statusText } from '@/lib/status';


type SortKey = 'label' | 'takes' | 'medianFloorDbfs' | 'clippedShare' | 'minEffectiveBits' | 'overTakes' | 'rateMismatchTakes' | 'aliasingTakes' | 'rejectRate' | 'converterCheck' | 'alerts';

const COLUMNS: { key: SortKey; label: string; unit?: string; title: string }[] = [
  { key: 'label', label: 'Recorder', title: 'Label, make and model' },
  { key: 'takes', label: 'Takes', title: 'Takes measured in the period' },
  { key: 'medianFloorDbfs', label: 'Noise floor', unit: 'dBFS, median', title: 'Median noise floor of the period’s takes' },
  { key: 'clippedShare', label: 'Clipped', unit: '% of takes', title: 'Share of takes with at least one clipping event, at or below full scale' },
  { key: 'minEffectiveBits', label: 'Effective bits', unit: 'lowest', title: 'Fewest effective bits seen in a take' },
  { key: 'overTakes', label: 'True-peak overs', unit: 'takes > 0 dBTP', title: 'Takes whose true peak is above 0 dBTP' },
  { key: 'rateMismatchTakes', label: 'Rate mismatch', unit: 'takes', title: 'Takes whose audio disagrees with the declared sample rate' },
  { key: 'aliasingTakes', label: 'Aliasing risk', unit: 'takes', title: 'Takes with energy up to Nyquist and no filter roll-off' },
  { key: 'rejectRate', label: 'Rejected', unit: '% of decided', title: 'Share of decided takes a producer rejected' },
  { key: 'converterCheck', label: 'Converter check', unit: 'last', title: 'Date and result of the latest converter check' },
  { key: 'alerts', label: 'Alerts', title: 'Open alerts: the last 14 days of takes, and the latest converter check' },
];

function sortValue(r: FleetRow, key: SortKey): number | string | null {
  if (key === 'alerts') return r.alerts.length;
  if (key === 'label') return r.label.toLowerCase();
  if (key === 'converterCheck') return r.converterCheck ? Date.parse(r.converterCheck.measuredAt) : null;
  return r[key];
}
const pct = (x: number | null) => (x === null ? '—' : `${(100 * x).toFixed(x < 0.1 && x > 0 ? 1 : 0)} %`);
const count = (n: number) => (n === 0 ? '0' : `▲ ${n}`);

/** The fleet, one row per recorder, sortable by every column, over a chosen period. */
export function FleetTable({ initialPeriod }: { initialPeriod: FleetPeriod }) {
  const [period, setPeriod] = useState<FleetPeriod>(initialPeriod);
  const [sort, setSort] = useState<{ key: SortKey; dir: 'asc' | 'desc' }>({ key: 'alerts', dir: 'desc' });
  const { data, error, isLoading } = useSWR<{ recorders: FleetRow[] }, ApiError>(fleetKey(period), { keepPreviousData: true });

  const rows = useMemo(() => {
    const list = [...(data?.recorders ?? [])];
    list.sort((a, b) => {
      const x = sortValue(a, sort.key);
      const y = sortValue(b, sort.key);
      if (x === null && y === null) return a.label.localeCompare(b.label);
      if (x === null) return 1; // no figure: always last
      if (y === null) return -1;
      const c = typeof x === 'string' ? x.localeCompare(y as string) : x - (y as number);
      return (sort.dir === 'asc' ? c : -c) || a.label.localeCompare(b.label);
    });
    return list;
  }, [data, sort]);

  function toggle(key: SortKey) {
    setSort((s) => (s.key === key ? { key, dir: s.dir === 'asc' ? 'desc' : 'asc' } : { key, dir: key === 'label' ? 'asc' : 'desc' }));
  }

  return (
    <section className="tp-card" aria-labelledby="fleet-heading">
      <div className="flex flex-wrap items-end gap-3 border-b border-line p-4">
        <h2 id="fleet-heading" className="mr-auto text-lg font-semibold">
          Recorders · {PERIOD_LABEL[String(period)]}
        </h2>
        <label className="text-sm">
          <span className="tp-label">Period</span>
          <select className="tp-input" value={String(period)} onChange={(e) => setPeriod(e.target.value === 'all' ? 'all' : (Number(e.target.value) as FleetPeriod))}>
            {FLEET_PERIODS.map((p) => (
              <option key={p} value={String(p)}>
                {PERIOD_LABEL[String(p)]}
              </option>
            ))}
          </select>
        </label>
      </div>
      <FormMessage error={error?.message} className="p-4" />
      {!error && isLoading && !data && <p className="p-4 text-muted">Loading the fleet…</p>}
      {data && rows.length === 0 && <p className="p-6 text-muted">No recorders yet. <Link href="/recorders" className="text-accent underline">Add one</Link>.</p>}
      {rows.length > 0 && (
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm" aria-label="Fleet statistics">
            <thead className="bg-sunken text-muted">
              <tr>
                {COLUMNS.map((c) => (
                  <th key={c.key} scope="col" className="px-3 py-2 align-bottom font-semibold" aria-sort={sort.key === c.key ? (sort.dir === 'asc' ? 'ascending' : 'descending') : 'none'}>
                    <button type="button" onClick={() => toggle(c.key)} className="text-left hover:text-ink" title={c.title}>
                      {c.label}
                      {c.unit && <span className="block text-xs font-normal">{c.unit}</span>}
                      <span aria-hidden="true" className="ml-1">
                        {sort.key === c.key ? (sort.dir === 'asc' ? '↑' : '↓') : '↕'}
                      </span>
                    </button>
                  </th>
                ))}
                <th scope="col" className="px-3 py-2 align-bottom font-semibold">
                  Trend<span className="block text-xs font-normal">weekly median floor</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.id} className="border-t border-line" data-testid="fleet-row">
                  <td className="px-3 py-2">
                    <Link href={`/fleet/${r.id}`} className="font-semibold text-accent underline-offset-2 hover:underline">
                      {r.label}
                    </Link>
                    <div className="text-xs text-muted">
                      {r.makeModel ?? 'Make not recorded'}
                      {!r.active && ` · ${statusText(RECORDER_STATUS.retired)}`}
                    </div>
                  </td>
                  <td className="px-3 py-2 font-mono">{r.takes}</td>
                  <td className="px-3 py-2 font-mono" data-col="medianFloorDbfs">{formatMeasure(r.medianFloorDbfs)}</td>
                  <td className="px-3 py-2 font-mono">{pct(r.clippedShare)}</td>
                  <td className="px-3 py-2 font-mono">{r.minEffectiveBits ?? '—'}</td>
                  <td className="px-3 py-2 font-mono">{count(r.overTakes)}</td>
                  <td className="px-3 py-2 font-mono">{count(r.rateMismatchTakes)}</td>
                  <td className="px-3 py-2 font-mono">{count(r.aliasingTakes)}</td>
                  <td className="px-3 py-2 font-mono">{pct(r.rejectRate)}</td>
                  <td className="px-3 py-2" data-col="converterCheck">
                    <LastCheckCell check={r.converterCheck} />
                  </td>
                  <td className="px-3 py-2">
                    {r.alerts.length === 0 ? (
                      <StatusMark status={ALERT_STATUS.none} className="font-normal" />
                    ) : (
                      <span className={r.alerts.some((a) => a.severity === 'fail') ? 'font-semibold text-fail' : 'font-semibold text-warn'} title={r.alerts.map((a) => a.title).join('; ')}>
                        {ALERT_STATUS[r.alerts.some((a) => a.severity === 'fail') ? 'fail' : 'warn'].mark} {r.alerts.length} {r.alerts.length === 1 ? 'alert' : 'alerts'}
                      </span>
                    )}
                  </td>
                  <td className="px-3 py-2">
                    <Sparkline
                      values={r.weeks.map((w) => w.medianFloorDbfs)}
                      label={
                        r.weeks.length
                          ? `Weekly median noise floor of ${r.label}: ${r.weeks.map((w) => w.medianFloorDbfs?.toFixed(1) ?? 'none').slice(-8).join(', ')} dBFS (latest weeks)`
                          : `No weekly figures for ${r.label}`
                      }
                    />
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
