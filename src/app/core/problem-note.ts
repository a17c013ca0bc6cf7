import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { ApiProblem } from './api-error';

/** Why a request did not go through, in the server's words, and when to try again if it said so. */
@Component({
  selector: 'bt-problem-note',
  imports: [MatIconModule],
  template: `
    @if (text(); as text) {
      <p class="note" role="alert">
        <mat-icon svgIcon="caution" aria-hidden="true" />
        <span>{{ text }}</span>
      </p>
    }
  `,
  styles: `
    .note {
      display: flex;
      align-items: flex-start;
      gap: 8px;
      margin: 0;
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    mat-icon {
      flex: none;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProblemNote {
  readonly problem = input.required<ApiProblem | null>();

  /** The server's own words; they already say when to try again after too many attempts. */
  protected readonly text = computed(() => this.problem()?.message ?? null);
}
