import Link from 'next/link';
import type { ReactNode } from 'react';
import { ROLE_LABEL, can } from '@/lib/auth/policy';
import { NAVIGATION } from '@/lib/auth/navigation';
import { SignOutButton } from './SignOutButton';
import type { Theme } from '@/lib/theme/themes';
import { ThemeSwitcher } from './ThemeSwitcher';
import { Wordmark } from './Wordmark';
import type { Actor } from '@/lib/auth/views';

export function AppShell({ actor, studioName, theme, children }: { actor: Actor; studioName: string; theme: Theme; children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 tp-button">
        Skip to content
      </a>
      <header className="border-b border-line bg-surface">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <Link href="/" aria-label="Takeproof overview">
            <Wordmark />
          </Link>
          <nav aria-label="Main" className="flex flex-wrap gap-1">
            {NAVIGATION.filter((item) => can(actor.role, item.capability)).map((item) => (
              <Link key={item.href} href={item.href} className="rounded-md px-3 py-1.5 text-sm font-semibold text-ink hover:bg-sunken">
                {item.label}
              </Link>
            ))}
          </nav>
          <div className="ml-auto flex flex-wrap items-center gap-3">
            <ThemeSwitcher initial={theme} />
            <Link href="/account" className="rounded-md px-2 py-1 text-right text-sm leading-tight hover:bg-sunken" data-testid="who" title="Your account">
              <div className="font-semibold">{actor.name}</div>
              <div className="text-muted">
                {ROLE_LABEL[actor.role]} · {studioName}
              </div>
            </Link>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-7xl px-4 py-6">
        {children}
      </main>
    </div>
  );
}
