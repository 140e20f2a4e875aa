import Link from 'next/link';
import type { FleetAlert } from '@/lib/fleet/alerts';

const SEVERITY = {
  fail: { mark: '■', word: 'Act now', className: 'text-fail' },
  warn: { mark: '▲', word: 'Check', className: 'text-warn' },
} as const;

/** Fleet alerts, each with a shape and a word for its severity (never colour alone). */
export function AlertList({ alerts, showRecorder = false }: { alerts: FleetAlert[]; showRecorder?: boolean }) {
  return (
    <ul className="divide-y divide-line">
      {alerts.map((a) => {
        const s = SEVERITY[a.severity];
        return (
          <li key={`${a.recorderId}-${a.kind}`} className="flex gap-3 px-4 py-3" data-testid="fleet-alert" data-kind={a.kind}>
            <span className={`mt-0.5 shrink-0 font-semibold ${s.className}`}>
              <span aria-hidden="true">{s.mark} </span>
              {s.word}
            </span>
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
