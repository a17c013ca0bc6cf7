import {
  DestroyRef,
  EnvironmentInjector,
  Injector,
  computed,
  createEnvironmentInjector,
  effect,
  signal,
  untracked,
  type Signal,
} from '@angular/core';

interface Opened<T> {
  readonly injector: EnvironmentInjector;
  readonly value: Signal<T>;
}

/**
 * One live query per key, for lists whose every row needs a query of its own (each build's pours, each
 * material's containers). A query opens when its key appears and stops when the key goes or `injector`
 * is destroyed, so a long-open screen holds no query for a record that left it.
 */
export function liveByKey<T>(
  keys: Signal<readonly string[]>,
  open: (key: string, injector: Injector) => Signal<T>,
  injector: Injector,
): Signal<ReadonlyMap<string, T>> {
  const parent = injector.get(EnvironmentInjector);
  const opened = new Map<string, Opened<T>>();
  const current = signal<readonly (readonly [string, Opened<T>])[]>([]);

  effect(
    () => {
      const wanted = new Set(keys());
      // Opening a query makes signals, which may not happen inside a reactive read.
      untracked(() => {
        for (const [key, entry] of opened) {
          if (wanted.has(key)) continue;
          entry.injector.destroy();
          opened.delete(key);
        }
        for (const key of wanted) {
          if (opened.has(key)) continue;
          const child = createEnvironmentInjector([], parent);
          opened.set(key, { injector: child, value: open(key, child) });
        }
        current.set([...opened]);
      });
    },
    { injector },
  );
  injector.get(DestroyRef).onDestroy(() => {
    for (const entry of opened.values()) entry.injector.destroy();
    opened.clear();
  });

  return computed(() => new Map(current().map(([key, entry]) => [key, entry.value()])));
}
