import Link from 'next/link';
import { fleetAlerts } from '@/lib/fleet/service.server';
import { AlertList } from './AlertList';
import type { Actor } from '@/lib/auth/views';

/** The manager's overview section: the fleet's open alerts, most serious first. */
export async function FleetAlertsSummary({ actor }: { actor: Actor }) {
  const alerts = await fleetAlerts(actor);
  return (
    <section className="tp-card mt-6" aria-labelledby="fleet-alerts">
      <div className="flex items-center justify-between border-b border-line p-4">
        <h2 id="fleet-alerts" className="text-lg font-semibold">
          Fleet alerts
        </h2>
        <Link href="/fleet" className="text-sm text-accent underline">
          Open the fleet
        </Link>
      </div>
      {alerts.length === 0 ? (
        <p className="p-4 text-muted">
          <span aria-hidden="true">● </span>No recorder needs attention.
        </p>
      ) : (
        <>
          <AlertList alerts={alerts.slice(0, 6)} showRecorder />
          {alerts.length > 6 && <p className="border-t border-line px-4 py-2 text-sm text-muted">and {alerts.length - 6} more on the fleet page.</p>}
        </>
      )}
    </section>
  );
}
