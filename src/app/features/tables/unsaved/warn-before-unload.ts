import { DOCUMENT, type Signal, effect, inject } from '@angular/core';

/**
 * While `when` is true, asks the browser to confirm closing or reloading the tab (the browser
 * writes the question itself). The listener exists only while there is something to lose (a
 * `beforeunload` listener keeps some browsers from caching the page) and goes with the caller:
 * an effect, so it follows the signal without zone.js and is cleaned up on destroy. Call it in
 * an injection context (a component's constructor).
 */
export function warnBeforeUnload(when: Signal<boolean>): void {
  const view = inject(DOCUMENT).defaultView;
  effect((onCleanup) => {
    if (!view || !when()) return;
    const ask = (event: BeforeUnloadEvent): void => {
      event.preventDefault();
      // Older browsers ask only when returnValue is set.
      event.returnValue = true;
    };
    view.addEventListener('beforeunload', ask);
    onCleanup(() => view.removeEventListener('beforeunload', ask));
  });
}
