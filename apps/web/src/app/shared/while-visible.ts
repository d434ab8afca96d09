import { distinctUntilChanged, EMPTY, fromEvent, map, startWith, switchMap, timer } from 'rxjs';
import type { Observable } from 'rxjs';

/**
 * A rhythm that keeps to the page being seen: every `ms` while the page is in view
 * (document.visibilityState), nothing while it is hidden (another tab, a minimised window), and
 * once at once when it comes back into view, then every `ms` again. The first tick comes `ms`
 * after subscribing (the caller has just read what it reads again).
 */
export function whileVisible(doc: Document, ms: number): Observable<void> {
  return fromEvent(doc, 'visibilitychange').pipe(
    startWith(null),
    map(() => doc.visibilityState !== 'hidden'),
    distinctUntilChanged(),
    switchMap((visible, i) => (visible ? timer(i === 0 ? ms : 0, ms) : EMPTY)),
    map(() => undefined),
  );
}
