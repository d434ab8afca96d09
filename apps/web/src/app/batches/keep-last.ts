import { scan, type OperatorFunction } from 'rxjs';
import type { Problem } from '../core/models';
import type { Loaded } from '../shared/load-state';

/** A value that is refreshed now and then: the last one read stays shown while the next loads. */
export interface Kept<T> {
  value: T | null;
  loading: boolean;
  problem: Problem | null;
}

export function nothingYet<T>(): Kept<T> {
  return { value: null, loading: true, problem: null };
}

/**
 * Folds a stream of Loaded states (from loadState, one per request) into what a page shows:
 * the last value stays while a refresh loads; a failed refresh keeps it and adds the problem.
 */
export function keepLast<T>(): OperatorFunction<Loaded<T>, Kept<T>> {
  return scan(
    (acc: Kept<T>, l: Loaded<T>): Kept<T> =>
      l.state === 'loading'
        ? { ...acc, loading: true }
        : l.state === 'ready'
          ? { value: l.value, loading: false, problem: null }
          : { value: acc.value, loading: false, problem: l.problem },
    nothingYet<T>(),
  );
}
