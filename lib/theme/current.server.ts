import 'server-only';
import { cookies } from 'next/headers';
import { THEME_COOKIE, themeOf, type Theme } from './themes';

export async function currentTheme(): Promise<Theme> {
  return themeOf((await cookies()).get(THEME_COOKIE)?.value);
}
