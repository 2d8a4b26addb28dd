import type { ReactNode } from 'react';

/** Leaves its children out of the printed page (React Native Web's View drops data-* props, so this is a plain div). */
export function NoPrint({ children }: { children: ReactNode }) {
  return <div data-print="hide">{children}</div>;
}
