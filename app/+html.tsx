import { ScrollViewStyleReset } from 'expo-router/html';
import type { PropsWithChildren } from 'react';

import { pageCss } from '@/constants/page-css';
import { colors } from '@/constants/theme';

/** The web page shell: language, viewport, colours before the bundle loads, and print rules. */
export default function Root({ children }: PropsWithChildren) {
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta httpEquiv="X-UA-Compatible" content="IE=edge" />
        <meta name="viewport" content="width=device-width, initial-scale=1, shrink-to-fit=no" />
        <meta name="theme-color" content={colors.accent} />
        <meta name="description" content="Lobewright: cam regrind specs, fit checks and grinder hand-off for engine repair shops." />
        <title>Lobewright</title>
        <ScrollViewStyleReset />
        <style dangerouslySetInnerHTML={{ __html: pageCss }} />
      </head>
      <body>{children}</body>
    </html>
  );
}
