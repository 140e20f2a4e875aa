import type { Metadata } from 'next';
import Link from 'next/link';
import { AlertList } from '@/components/AlertList';
import { RecorderTrends } from '@/components/RecorderTrends';
import { DecisionMark, StatusMark, VerdictMark } from '@/components/StatusMarks';
import { requireActor } from '@/lib/auth/guard.server';
import { recorderFleetDetail } from '@/lib/fleet/service.server';
import { DEFAULT_ALERT_SETTINGS } from '@/lib/fleet/alerts';
import { FLEET_PERIODS, PERIOD_LABEL, RECENT_TAKES, parsePeriod } from '@/lib/fleet/views';
import { loadPage } from '@/lib/http/pages.server';
import { idParam } from '@/lib/http/route.server';
import { formatDateTime, formatMeasure } from '@/lib/format';
import { MEASURE, labelWithUnit } from '@/lib/glossary';
import { RECORDER_STATUS, ALERT_STATUS } from '@/lib/status';

export const metadata: Metadata = { title: 'Recorder trends' };

export default async function RecorderTrendsPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ days?: string }> }) {
  const period = parsePeriod((await searchParams).days ?? '90') ?? 90;
  const { recorder, weeks, takes, alerts } = await loadPage(async () => {
    const actor = await requireActor('fleet:view');
    const { recorder, weeks, recentTakes: takes, alerts } = await recorderFleetDetail(actor, await idParam(params, 'recorder'), period);
    return { recorder, weeks, takes, alerts };
  });
  const s = DEFAULT_ALERT_SETTINGS;
  return (
    <article>
      <p className="mb-2 text-sm">
        <Link href="/fleet" className="text-accent hover:underline">← Fleet</Link>
      </p>
      <header className="mb-4 flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <h1 className="text-2xl font-semibold">{recorder.label}</h1>
          <p className="text-sm text-muted">
            {recorder.makeModel ?? 'Make not recorded'} · {recorder.location ?? 'No location'} · serial <span className="font-mono">{recorder.serial ?? '—'}</span> ·{' '}
            <StatusMark status={RECORDER_STATUS[recorder.active ? 'active' : 'retired']} className="font-normal" /> ·{' '}
            <Link href={`/recorders/${recorder.id}`} className="text-accent underline">
              Edit
            </Link>{' '}
            ·{' '}
            <Link href={`/recorders/${recorder.id}/converter`} className="text-accent underline">
              Converter checks
            </Link>
          </p>
        </div>
        <nav aria-label="Period" className="flex gap-1">
          {FLEET_PERIODS.map((p) => (
            <Link
              key={p}
              href={`/fleet/${recorder.id}?days=${p}`}
              aria-current={p === period ? 'page' : undefined}
              className={p === period ? 'tp-button' : 'tp-button-quiet'}
            >
              {PERIOD_LABEL[String(p)]}
            </Link>
          ))}
        </nav>
      </header>

      <section className="tp-card mb-6" aria-labelledby="alerts-heading">
        <h2 id="alerts-heading" className="border-b border-line p-4 text-lg font-semibold">
          Alerts
        </h2>
        {!recorder.active ? (
          <p className="p-4 text-muted">This recorder is retired; it raises no alerts.</p>
        ) : alerts.length === 0 ? (
          <p className="p-4 text-muted">
            <span aria-hidden="true">{ALERT_STATUS.none.mark} </span>No alerts: over the last {s.recentDays} days this recorder measures like its own previous {s.baselineDays} days.
          </p>
        ) : (
          <AlertList alerts={alerts} />
        )}
      </section>

      <h2 className="mb-2 text-lg font-semibold">Trends · {PERIOD_LABEL[String(period)]}</h2>
      <RecorderTrends weeks={weeks} />

      <section className="tp-card mt-6" aria-labelledby="recent-heading">
        <h2 id="recent-heading" className="border-b border-line p-4 text-lg font-semibold">
          Recent takes <span className="text-sm font-normal text-muted">the newest {RECENT_TAKES}, worst first</span>
        </h2>
        {takes.length === 0 ? (
          <p className="p-4 text-muted">No measured takes from this recorder yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead className="bg-sunken text-muted">
                <tr>
                  <th scope="col" className="px-3 py-2 font-semibold">Take</th>
                  <th scope="col" className="px-3 py-2 font-semibold">Measured</th>
                  {(['noiseFloor', 'effectiveBits', 'integratedLoudness', 'truePeak', 'clipEvents'] as const).map((key) => (
                    <th key={key} scope="col" className="px-3 py-2 font-semibold">
                      {key === 'effectiveBits' || key === 'clipEvents' ? MEASURE[key].label : labelWithUnit(key)}
                    </th>
                  ))}
                  <th scope="col" className="px-3 py-2 font-semibold">Verdict</th>
                  <th scope="col" className="px-3 py-2 font-semibold">Decision</th>
                </tr>
              </thead>
              <tbody>
                {takes.map((t) => (
                  <tr key={t.id} className="border-t border-line">
                    <td className="px-3 py-2">
                      <Link href={`/takes/${t.id}`} className="font-semibold text-accent underline-offset-2 hover:underline">
                        {t.originalName}
                      </Link>
                      {t.reason && <div className="text-xs">{t.reason}</div>}
                      <div className="text-xs text-muted">{t.sessionTitle}</div>
                    </td>
                    <td className="whitespace-nowrap px-3 py-2 font-mono">{formatDateTime(t.measuredAt)}</td>
                    <td className="px-3 py-2 font-mono">{formatMeasure(t.noiseFloorDbfs)}</td>
                    <td className="px-3 py-2 font-mono">{t.effectiveBits ?? '—'}</td>
                    <td className="px-3 py-2 font-mono">{formatMeasure(t.integratedLufs)}</td>
                    <td className="px-3 py-2 font-mono">{formatMeasure(t.truePeakDbtp)}</td>
                    <td className="px-3 py-2 font-mono">
                      {t.clipEvents ?? '—'}
                      {t.belowFullScaleClipEvents ? ` (${t.belowFullScaleClipEvents} below 0 dBFS)` : ''}
                    </td>
                    <td className="px-3 py-2"><VerdictMark verdict={t.verdict} /></td>
                    <td className="px-3 py-2"><DecisionMark decision={t.decision} /></td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </article>
  );
}
