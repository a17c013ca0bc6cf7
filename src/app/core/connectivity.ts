import { Injectable } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { fromEvent, map, merge, startWith } from 'rxjs';

/** Whether the browser believes it has a connection; the bench works either way. */
@Injectable({ providedIn: 'root' })
export class Connectivity {
  readonly online = toSignal(
    merge(fromEvent(window, 'online'), fromEvent(window, 'offline')).pipe(
      map(() => navigator.onLine),
      startWith(navigator.onLine),
    ),
    { requireSync: true },
  );
}
