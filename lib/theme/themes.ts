/** The colour themes and the cookie that remembers the choice; safe to import from client components. */
export const THEMES = [
  { value: 'system', label: 'Match system' },
  { value: 'light', label: 'Proof paper (light)' },
  { value: 'dark', label: 'Night desk (dark)' },
] as const;

export type Theme = (typeof THEMES)[number]['value'];

export const THEME_COOKIE = 'tp-theme';

/** A stored cookie value as a theme; anything unknown follows the system. */
export function themeOf(value: string | undefined): Theme {
  return value === 'light' || value === 'dark' ? value : 'system';
}
