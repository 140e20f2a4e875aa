'use client';

import { useRouter } from 'next/navigation';
import { useEffect } from 'react';
import { isTyping } from './usePlayerKeys';

/**
 * ← → open the previous or next take in the session table's order, unless the waveform used the
 * key to step to a finding (it marks the event as handled). The check waits until every listener
 * has seen the key, whichever registered first.
 */
export function useTakeStepKeys(previousHref: string | null, nextHref: string | null) {
  const router = useRouter();
  useEffect(() => {
    const down = (event: KeyboardEvent) => {
      if (event.defaultPrevented || event.altKey || event.ctrlKey || event.metaKey || event.shiftKey || isTyping(event.target)) return;
      const href = event.key === 'ArrowRight' ? nextHref : event.key === 'ArrowLeft' ? previousHref : null;
      if (!href) return;
      setTimeout(() => {
        if (!event.defaultPrevented) router.push(href);
      }, 0);
    };
    window.addEventListener('keydown', down);
    return () => window.removeEventListener('keydown', down);
  }, [router, previousHref, nextHref]);
}
