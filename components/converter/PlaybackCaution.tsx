import { PLAYBACK_CAUTION } from '@/lib/converterChecks/views';

/** The playback-level caution, shown wherever the check signal is offered or a check is read. */
export function PlaybackCaution() {
  return (
    <p role="note" className="rounded-md border border-warn bg-sunken p-3 text-sm" data-testid="playback-caution">
      <strong className="text-warn">
        <span aria-hidden="true">▲ </span>Loud test signal.
      </strong>{' '}
      {PLAYBACK_CAUTION}
    </p>
  );
}
