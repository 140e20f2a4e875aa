import type { Metadata } from 'next';
import Link from 'next/link';
import { IntervalForm } from '@/components/converter/IntervalForm';
import { FleetTable } from '@/components/FleetTable';
import { converterCheckIntervalDays } from '@/lib/converterChecks/service.server';
import { SwrProvider } from '@/components/SwrProvider';
import { requireActor } from '@/lib/auth/guard.server';
import { DEFAULT_ALERT_SETTINGS } from '@/lib/fleet/alerts';
import { fleetOverview } from '@/lib/fleet/service.server';
import { fleetKey } from '@/lib/http/swrKeys';
import { loadPage } from '@/lib/http/pages.server';

export const metadata: Metadata = { title: 'Fleet' };

export default async function FleetPage() {
  const { overview, intervalDays } = await loadPage(async () => {
    const actor = await requireActor('fleet:view');
    return { overview: await fleetOverview(actor, 30), intervalDays: await converterCheckIntervalDays(actor.studioId) };
  });
  const s = DEFAULT_ALERT_SETTINGS;
  return (
    <SwrProvider fallback={{ [fleetKey(30)]: overview }}>
      <div className="mb-2 flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-2xl font-semibold">Fleet</h1>
        <Link href="/recorders" className="tp-button-quiet">
          Manage recorders
        </Link>
      </div>
      <p className="mb-4 max-w-prose text-muted">
        How each recorder’s takes measure over time. Alerts compare the last {s.recentDays} days with the recorder’s own {s.baselineDays} days before: a noise floor
        more than {s.driftDb} dB higher (a Takeproof default), effective bits below the studio’s delivery specs, repeated clipping below full scale, and sample-rate mismatches.
        Converter checks are kept apart from the takes: a recorder alerts when its latest check drifted from its baseline, or when it is older than {intervalDays} days.
      </p>
      <div className="mb-4">
        <IntervalForm days={intervalDays} />
      </div>
      <FleetTable initialPeriod={30} />
    </SwrProvider>
  );
}
