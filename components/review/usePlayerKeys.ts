'use client';

import { useEffect, useEffectEvent } from 'react';

/** Keys in these elements belong to the element, not to the player. */
export function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el || !el.tagName) return false;
  return el.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(el.tagName);
}

/**
 * Space plays or pauses, ← → step between findings; never while typing in a field, and only
 * while `active`. `step` answers whether there was a finding to move to.
 */
export function usePlayerKeys(active: boolean, actions: { playPause: () => void; step: (direction: 1 | -1) => boolean }) {
  const onKeyDown = useEffectEvent((event: KeyboardEvent) => {
    if (event.defaultPrevented || event.altKey || event.ctrlKey || event.metaKey || isTyping(event.target)) return;
    if (event.key === ' ') {
      event.preventDefault();
      actions.playPause();
    } else if ((event.key === 'ArrowRight' || event.key === 'ArrowLeft') && actions.step(event.key === 'ArrowRight' ? 1 : -1)) {
      event.preventDefault();
    }
  });
  // A focused button would also "click" on the space key's release; the key already played or paused.
  const onKeyUp = useEffectEvent((event: KeyboardEvent) => {
    if (event.key === ' ' && !isTyping(event.target)) event.preventDefault();
  });
  useEffect(() => {
    if (!active) return;
    const down = (event: KeyboardEvent) => onKeyDown(event);
    const up = (event: KeyboardEvent) => onKeyUp(event);
    window.addEventListener('keydown', down);
    window.addEventListener('keyup', up);
    return () => {
      window.removeEventListener('keydown', down);
      window.removeEventListener('keyup', up);
    };
  }, [active]);
}
