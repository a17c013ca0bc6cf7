import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { Router } from '@angular/router';
import { formatNumber } from '@benchtide/shared';
import { format } from 'date-fns';
import { map, timer } from 'rxjs';
import { BenchToday, followAt, type PourOnBench, type ShelfNotice } from './bench-today';
import { LayerRecorder } from './layer-recorder';
import { PourTimer } from './pour-timer';

/** What a notification's action asks of the bench, from the address it opened (see pour-alerts.ts). */
export interface BenchRequest {
  readonly pourId: string;
  readonly layer: number;
  readonly act: 'poured' | 'weigh';
}

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
  private readonly recorder = inject(LayerRecorder);
  private readonly router = inject(Router);

  readonly request = input<BenchRequest | null>(null);

  protected readonly pours = this.today.pours;
  protected readonly shelf = this.today.shelf;
  protected readonly now = toSignal(timer(0, 1000).pipe(map(() => Date.now())), { initialValue: Date.now() });
  protected readonly weighPourId = signal<string | null>(null);
  protected readonly problem = signal<string | null>(null);
  private answered: BenchRequest | null = null;

  constructor() {
    effect(() => {
      const request = this.request();
      const pour = this.pours().find((candidate) => candidate.id === request?.pourId);
      if (!request || !pour || request === this.answered) return;
      this.answered = request;
      untracked(() => void this.answer(request, pour));
    });
  }

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

  /** The action is the tap: it is done at once, and the address is cleared so a reload does not do it again. */
  private async answer(request: BenchRequest, pour: PourOnBench): Promise<void> {
    await this.router.navigate([], { queryParams: {}, replaceUrl: true });
    if (request.act === 'weigh') {
      this.weighPourId.set(pour.id);
      return;
    }
    const below = followAt(pour, Date.now()).layers[request.layer - 2];
    const roomTempC = below?.roomTempC ?? pour.plan.request.roomTempC;
    const number = request.layer;
    this.problem.set(await this.recorder.record({ pourId: pour.id, number, pouredAtMs: Date.now(), roomTempC }));
  }
}
