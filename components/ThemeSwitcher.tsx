'use client';

import { useState } from 'react';
import { THEME_COOKIE, THEMES, type Theme } from '@/lib/theme/themes';

/** Switches the colour theme at once and remembers it in a cookie for the next page load. */
export function ThemeSwitcher({ initial }: { initial: Theme }) {
  const [theme, setTheme] = useState<Theme>(initial);
  return (
    <label className="flex items-center gap-2 text-sm text-muted">
      <span className="sr-only sm:not-sr-only">Theme</span>
      <select
        className="rounded-md border border-line bg-surface px-2 py-1 text-sm text-ink"
        value={theme}
        onChange={(event) => {
          const next = event.target.value as Theme;
          setTheme(next);
          document.documentElement.dataset.theme = next;
          document.cookie = `${THEME_COOKIE}=${next}; path=/; max-age=31536000; samesite=lax`;
        }}
      >
        {THEMES.map((t) => (
          <option key={t.value} value={t.value}>
            {t.label}
          </option>
        ))}
      </select>
    </label>
  );
}
