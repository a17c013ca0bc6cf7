import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { MORE_ENTRIES } from '../core/navigation';

/** On a phone, the screens the bottom bar has no room for. */
@Component({
  selector: 'bt-more-page',
  imports: [MatIconModule, RouterLink],
  template: `
    <h1>More</h1>
    <ul class="entries">
      @for (entry of entries; track entry.path) {
        <li>
          <a [routerLink]="entry.path">
            <mat-icon [svgIcon]="entry.icon" aria-hidden="true" />
            <span>{{ entry.label }}</span>
            <mat-icon class="go" svgIcon="forward" aria-hidden="true" />
          </a>
        </li>
      }
    </ul>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 16px;
      max-width: 560px;
      margin: 0 auto;
    }
    h1 {
      margin: 0;
    }
    .entries {
      margin: 0;
      padding: 0;
      list-style: none;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 16px;
      overflow: hidden;
    }
    li + li {
      border-top: 1px solid var(--mat-sys-outline-variant);
    }
    a {
      display: flex;
      align-items: center;
      gap: 16px;
      min-height: 56px;
      padding: 0 16px;
      color: inherit;
      text-decoration: none;
      font: var(--mat-sys-body-large);
    }
    a:focus-visible {
      outline: 3px solid var(--mat-sys-primary);
      outline-offset: -3px;
    }
    .go {
      margin-left: auto;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MorePage {
  protected readonly entries = MORE_ENTRIES;
}
