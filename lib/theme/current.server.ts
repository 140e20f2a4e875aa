import 'server-only';
import { cookies } from 'next/headers';
import type { Theme } from '@/components/ThemeSwitcher';

export async function currentTheme(): Promise<Theme> {
  const value = (await cookies()).get('tp-theme')?.value;
  return value === 'light' || value === 'dark' ? value : 'system';
}
