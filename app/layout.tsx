import type { Metadata } from 'next';
import type { ReactNode } from 'react';
import { currentTheme } from '@/lib/theme/current.server';
import { atkinsonHyperlegible, atkinsonHyperlegibleMono } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Takeproof', template: '%s · Takeproof' },
  description: 'Technical quality control of recorded takes for broadcast and podcast studios.',
  icons: { icon: '/takeproof-mark.svg' },
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" data-theme={await currentTheme()} className={`${atkinsonHyperlegible.variable} ${atkinsonHyperlegibleMono.variable}`}>
      <body className="bg-paper font-sans text-ink antialiased">{children}</body>
    </html>
  );
}
