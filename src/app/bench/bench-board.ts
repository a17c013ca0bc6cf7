import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { formatNumber } from '@benchtide/shared';
import { format } from 'date-fns';
import { map, timer } from 'rxjs';
import { BenchToday, type ShelfNotice } from './bench-today';
import { PourTimer } from './pour-timer';

/** The signed-in bench: the pours curing now, each with its timer, and what on the shelf needs an eye. */
@Component({
  selector: 'bt-bench-board',
  imports: [MatIconModule, PourTimer],
  templateUrl: './bench-board.html',
  styleUrl: './bench-board.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BenchBoard {
  private readonly today = inject(BenchToday);

  protected readonly pours = this.today.pours;
  protected readonly shelf = this.today.shelf;
  protected readonly now = toSignal(timer(0, 1000).pipe(map(() => Date.now())), { initialValue: Date.now() });

  protected notice(warning: ShelfNotice): string {
    const part = warning.materialName;
    const left = `${formatNumber(warning.remainingQty)} ${warning.unit} left`;
    switch (warning.kind) {
      case 'empty':
        return `${part}: a container is empty`;
      case 'low':
        return `${part}: running low, ${left}`;
      case 'expired':
        return `${part}: past its use-by day (${format(warning.day!, 'd MMM yyyy')}), ${left}`;
      case 'expiring':
        return `${part}: use by ${format(warning.day!, 'd MMM')}, ${left}`;
    }
  }
}
