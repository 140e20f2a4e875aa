'use client';

import { useEffect, useState } from 'react';

const TOKENS = ['paper', 'surface', 'sunken', 'ink', 'muted', 'line', 'accent', 'pass', 'warn', 'fail'] as const;
export type ThemeColors = Record<(typeof TOKENS)[number], string> & { alpha: (token: (typeof TOKENS)[number], a: number) => string };

function read(): ThemeColors {
  const style = getComputedStyle(document.documentElement);
  const triplets = Object.fromEntries(TOKENS.map((t) => [t, style.getPropertyValue(`--tp-${t}`).trim() || '128 128 128'])) as Record<(typeof TOKENS)[number], string>;
  const colors = Object.fromEntries(TOKENS.map((t) => [t, `rgb(${triplets[t]})`])) as Record<(typeof TOKENS)[number], string>;
  return { ...colors, alpha: (token, a) => `rgb(${triplets[token]} / ${a})` };
}

/**
 * The palette's colours as CSS colour strings, for canvases that cannot use the
 * Tailwind classes (waveform, plots); read again whenever the theme changes.
 */
export function useThemeColors(): ThemeColors | null {
  const [colors, setColors] = useState<ThemeColors | null>(null);
  useEffect(() => {
    // A new object only when a colour really changed, so canvases are not redrawn for nothing.
    const update = () => setColors((current) => {
      const next = read();
      return current && TOKENS.every((t) => current[t] === next[t]) ? current : next;
    });
    update();
    const observer = new MutationObserver(update);
    observer.observe(document.documentElement, { attributes: true, attributeFilter: ['data-theme', 'class', 'style'] });
    const media = window.matchMedia('(prefers-color-scheme: dark)');
    media.addEventListener('change', update);
    return () => {
      observer.disconnect();
      media.removeEventListener('change', update);
    };
  }, []);
  return colors;
}
