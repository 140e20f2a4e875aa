import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { AppShell } from '@/components/AppShell';
import { currentActor } from '@/lib/auth/guard.server';
import { studioName } from '@/lib/studio/studio.server';
import { currentTheme } from '@/lib/theme/current.server';

export default async function SignedInLayout({ children }: { children: ReactNode }) {
  const actor = await currentActor();
  if (!actor) redirect('/signin');
  return (
    <AppShell actor={actor} studioName={await studioName(actor)} theme={await currentTheme()}>
      {children}
    </AppShell>
  );
}
