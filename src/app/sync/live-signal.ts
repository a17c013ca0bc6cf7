import type { Injector, Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { liveQuery } from 'dexie';
import { from, switchMap } from 'rxjs';

/**
 * A Dexie query as a signal, run again whenever a table it read changes (in this tab or another).
 * Call it in an injection context, or pass one: the query stops when that context is destroyed.
 */
export function liveSignal<T>(query: () => T | Promise<T>, initialValue: T, injector?: Injector): Signal<T> {
  return toSignal(from(liveQuery(query)), { initialValue, injector });
}

/** The same, for a query that depends on a signal: the query is rebuilt when the signal changes. */
export function liveSignalOf<S, T>(
  source: Signal<S>,
  query: (value: S) => T | Promise<T>,
  initialValue: T,
  injector?: Injector,
): Signal<T> {
  const results = toObservable(source, { injector }).pipe(switchMap((value) => from(liveQuery(() => query(value)))));
  return toSignal(results, { initialValue, injector });
}
