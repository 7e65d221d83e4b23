import { ScrollViewStyleReset } from 'expo-router/html';
import type { PropsWithChildren } from 'react';
import { darkPalette, lightPalette } from '../components/theme/colors';

// The page shell for web builds: viewport, colours before the bundle runs, no body scroll
// (each screen scrolls itself).
const pageColours = `
html, body { background-color: ${lightPalette.paper}; color: ${lightPalette.ink}; }
@media (prefers-color-scheme: dark) {
  html, body { background-color: ${darkPalette.paper}; color: ${darkPalette.ink}; }
}`;

export default function Root({ children }: PropsWithChildren) {
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta httpEquiv="X-UA-Compatible" content="IE=edge" />
        <meta name="viewport" content="width=device-width, initial-scale=1, viewport-fit=cover" />
        <meta name="theme-color" content={lightPalette.paper} media="(prefers-color-scheme: light)" />
        <meta name="theme-color" content={darkPalette.paper} media="(prefers-color-scheme: dark)" />
        <meta name="color-scheme" content="light dark" />
        <title>Parallax</title>
        <ScrollViewStyleReset />
        <style dangerouslySetInnerHTML={{ __html: pageColours }} />
      </head>
      <body>{children}</body>
    </html>
  );
}
