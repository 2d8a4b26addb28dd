import type { ReactNode } from 'react';

/** The phone apps do not print from here; the children show as they are. */
export function NoPrint({ children }: { children: ReactNode }) {
  return <>{children}</>;
}
