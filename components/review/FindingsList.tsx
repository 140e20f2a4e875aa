'use client';

import { useEffect, useRef } from 'react';
import { formatClock } from '@/lib/format';
import type { TimedMarker } from '@/lib/review/reportView';
import { SeverityMark } from './marks';

/** The timed findings beside the waveform; picking one plays it from just before. */
export function FindingsList({ markers, selected, onPick }: { markers: TimedMarker[]; selected: number | null; onPick: (index: number) => void }) {
  const listRef = useRef<HTMLOListElement>(null);
  const counts = { fail: 0, warn: 0, info: 0 };
  for (const m of markers) counts[m.severity]++;

  // Keep the chosen finding in view when the arrow keys step through a long list.
  useEffect(() => {
    if (selected !== null) listRef.current?.querySelectorAll('button')[selected]?.scrollIntoView({ block: 'nearest' });
  }, [selected]);

  return (
    <section className="tp-card p-4" aria-labelledby="findings-heading">
      <h2 id="findings-heading" className="text-lg font-semibold">
        Findings in time
      </h2>
      <p className="mb-2 text-xs text-muted">
        {markers.length === 0
          ? 'Nothing in this take is tied to a moment in time.'
          : `${markers.length} marked: ${counts.fail} fail, ${counts.warn} warn, ${counts.info} note. Click one to hear it from a second before.`}
      </p>
      <ol ref={listRef} className="max-h-[28rem] space-y-1 overflow-y-auto" data-testid="findings-list">
        {markers.map((m, i) => (
          <li key={m.id}>
            <button
              type="button"
              className={`w-full rounded-md border px-2 py-1.5 text-left text-sm hover:bg-sunken ${selected === i ? 'border-accent bg-sunken' : 'border-transparent'}`}
              aria-current={selected === i ? 'true' : undefined}
              onClick={() => onPick(i)}
              data-start={m.startSec}
            >
              <span className="flex items-center gap-2">
                <SeverityMark severity={m.severity} />
                <span className="font-mono text-xs">{formatClock(m.startSec)}</span>
                <span className="font-semibold">{m.label}</span>
              </span>
              <span className="block text-xs text-muted">{m.message}</span>
            </button>
          </li>
        ))}
      </ol>
    </section>
  );
}
