import Link from 'next/link';
import type { FleetAlert } from '@/lib/fleet/alerts';
import { StatusMark } from './StatusMarks';
import { ALERT_STATUS } from '@/lib/status';


/** Fleet alerts, each with a shape and a word for its severity (never colour alone). */
export function AlertList({ alerts, showRecorder = false }: { alerts: FleetAlert[]; showRecorder?: boolean }) {
  return (
    <ul className="divide-y divide-line">
      {alerts.map((a) => {
        const s = ALERT_STATUS[a.severity];
        return (
          <li key={`${a.recorderId}-${a.kind}`} className="flex gap-3 px-4 py-3" data-testid="fleet-alert" data-kind={a.kind}>
            <StatusMark status={s} className="mt-0.5 shrink-0 self-start" />
            <div>
              <p className="font-semibold">
                {showRecorder && (
                  <>
                    <Link href={`/fleet/${a.recorderId}`} className="text-accent hover:underline">
                      {a.label}
                    </Link>
                    {': '}
                  </>
                )}
                {a.title}
              </p>
              <p className="text-sm text-muted">{a.message}</p>
            </div>
          </li>
        );
      })}
    </ul>
  );
}
