import localFont from 'next/font/local';

// Atkinson Hyperlegible, shipped from its npm package: letters that stay distinct at a glance in a dim room.
export const atkinsonHyperlegible = localFont({
  src: [
    { path: '../node_modules/@fontsource-variable/atkinson-hyperlegible-next/files/atkinson-hyperlegible-next-latin-wght-normal.woff2', style: 'normal' },
    { path: '../node_modules/@fontsource-variable/atkinson-hyperlegible-next/files/atkinson-hyperlegible-next-latin-wght-italic.woff2', style: 'italic' },
  ],
  weight: '200 800',
  variable: '--font-sans',
  display: 'swap',
});

export const atkinsonHyperlegibleMono = localFont({
  src: [{ path: '../node_modules/@fontsource-variable/atkinson-hyperlegible-mono/files/atkinson-hyperlegible-mono-latin-wght-normal.woff2', style: 'normal' }],
  weight: '200 800',
  variable: '--font-mono',
  display: 'swap',
});
