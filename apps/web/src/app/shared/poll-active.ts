import type { Signal } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { EMPTY, exhaustMap, forkJoin, type Observable, switchMap, timer } from 'rxjs';

/**
 * Jobs read again while they run: while `ids` holds any id, every `ms` each of them is read with
 * `read` (all together; the next round only once the last has answered); nothing while `ids` is
 * empty. Call it in an injection context (a constructor).
 */
export function pollActive<T>(
  ids: Signal<readonly number[]>,
  read: (id: number) => Observable<T>,
  ms: number,
): Observable<T[]> {
  return toObservable(ids).pipe(
    switchMap((list) =>
      list.length === 0 ? EMPTY : timer(ms, ms).pipe(exhaustMap(() => forkJoin(list.map(read)))),
    ),
  );
}
