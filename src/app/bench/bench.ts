import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { AccountSession } from '../core/account-session';
import { BenchBoard, type BenchRequest } from './bench-board';

@Component({
  selector: 'bt-bench',
  imports: [MatButtonModule, MatCardModule, MatIconModule, RouterLink, BenchBoard],
  templateUrl: './bench.html',
  styleUrl: './bench.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Bench {
  protected readonly signedIn = inject(AccountSession).signedIn;

  /** From a notification's action: /?pour=<id>&layer=<n>&act=poured, or /?pour=<id>&weigh=<n>. */
  readonly pour = input<string>();
  readonly layer = input<string>();
  readonly act = input<string>();
  readonly weigh = input<string>();

  protected readonly request = computed<BenchRequest | null>(() => {
    const pourId = this.pour();
    if (!pourId) return null;
    if (this.act() === 'poured' && Number(this.layer()) >= 2)
      return { pourId, layer: Number(this.layer()), act: 'poured' };
    if (Number(this.weigh()) >= 2) return { pourId, layer: Number(this.weigh()), act: 'weigh' };
    return null;
  });
}
