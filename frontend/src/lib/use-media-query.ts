import { useCallback, useSyncExternalStore } from 'react';

/** Whether a CSS media query matches now; true where the browser cannot tell (tests without matchMedia). */
export function useMediaQuery(query: string): boolean {
  const subscribe = useCallback(
    (onChange: () => void) => {
      if (typeof window.matchMedia !== 'function') return () => undefined;
      const list = window.matchMedia(query);
      list.addEventListener('change', onChange);
      return () => list.removeEventListener('change', onChange);
    },
    [query],
  );
  const get = () => (typeof window.matchMedia === 'function' ? window.matchMedia(query).matches : true);
  return useSyncExternalStore(subscribe, get, () => true);
}

/** The width from which the side navigation and the name in the top bar are shown (matches app.css). */
export const WIDE_SCREEN = '(min-width: 861px)';

/** From this width a table keeps its columns (scrolling sideways if need be); below it each row stacks. */
export const WIDE_TABLE = '(min-width: 761px)';
