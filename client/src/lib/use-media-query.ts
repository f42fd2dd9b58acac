/** Whether a CSS media query matches now, kept current: lets a screen skip rendering what CSS would hide. */
import { useSyncExternalStore } from 'react';

export function useMediaQuery(query: string): boolean {
  return useSyncExternalStore(
    (onChange) => {
      const m = window.matchMedia(query);
      m.addEventListener('change', onChange);
      return () => m.removeEventListener('change', onChange);
    },
    () => window.matchMedia(query).matches,
    () => false,
  );
}

/** Tailwind's lg breakpoint (64rem), where the workspace shows its loads aside. */
export const WIDE_SCREEN = '(min-width: 64rem)';
