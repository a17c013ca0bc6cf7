import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { Connectivity } from './core/connectivity';
import { NAVIGATION } from './core/navigation';

@Component({
  selector: 'bt-root',
  imports: [RouterOutlet, RouterLink, RouterLinkActive, MatIconModule],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  private readonly connectivity = inject(Connectivity);

  protected readonly navigation = NAVIGATION;
  protected readonly online = this.connectivity.online;
}
