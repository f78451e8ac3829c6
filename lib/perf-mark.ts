import { useLayoutEffect } from 'react';

/** User Timing names the app sets once per page load; `npm run bench:offline` reads them. */
export const MARKS = { scheduleShown: 'ampwright:schedule-shown' } as const;

/**
 * Marks the first time a screen's content is in the page (a layout effect: after the DOM is
 * written, before it is painted). A benchmark that polled the page for the element instead would
 * spend the slowed CPU it measures; this mark costs nothing and reads the same moment.
 */
export function useFirstMark(name: string): void {
  useLayoutEffect(() => {
    if (typeof performance === 'undefined' || typeof performance.mark !== 'function') return;
    if (performance.getEntriesByName(name, 'mark').length === 0) performance.mark(name);
  }, [name]);
}
