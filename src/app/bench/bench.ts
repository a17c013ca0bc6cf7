import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { AccountSession } from '../core/account-session';
import { BenchBoard } from './bench-board';

@Component({
  selector: 'bt-bench',
  imports: [MatButtonModule, MatCardModule, MatIconModule, RouterLink, BenchBoard],
  templateUrl: './bench.html',
  styleUrl: './bench.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Bench {
  protected readonly signedIn = inject(AccountSession).signedIn;
}
