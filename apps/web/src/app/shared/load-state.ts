import { catchError, map, of, startWith, type Observable } from 'rxjs';
import { toProblem } from '../core/problem';
import type { Problem } from '../core/models';

/** What a page knows about one request: still loading, the value, or the problem. */
export type Loaded<T> =
  { state: 'loading' } | { state: 'ready'; value: T } | { state: 'error'; problem: Problem };

/** Turns a request into a stream of its states: loading first, then the value or the problem. */
export function loadState<T>(source: Observable<T>): Observable<Loaded<T>> {
  return source.pipe(
    map((value): Loaded<T> => ({ state: 'ready', value })),
    catchError((err: unknown) => of<Loaded<T>>({ state: 'error', problem: toProblem(err) })),
    startWith<Loaded<T>>({ state: 'loading' }),
  );
}

/** The value of a Loaded, or undefined. */
export function valueOf<T>(l: Loaded<T>): T | undefined {
  return l.state === 'ready' ? l.value : undefined;
}
