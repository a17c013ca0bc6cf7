import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { DEFERENCE_NOTE, safetyCautions, type MaterialKindName } from '@benchtide/shared';

/** The usual cautions for the material on screen, always ending with the data sheet's word. */
@Component({
  selector: 'bt-pour-cautions',
  imports: [MatIconModule],
  template: `
    <section class="cautions" aria-labelledby="cautions-title">
      <h2 id="cautions-title"><mat-icon svgIcon="caution" aria-hidden="true" /> Before you pour</h2>
      <ul>
        @for (caution of cautions(); track caution.id) {
          <li [attr.data-caution]="caution.id">{{ caution.text }}</li>
        }
      </ul>
      <p class="defer">{{ deference }}</p>
    </section>
  `,
  styles: `
    .cautions {
      padding: 16px;
      border-radius: 12px;
      background: var(--bt-caution-bg);
      color: var(--bt-caution-fg);
    }
    h2 {
      display: flex;
      align-items: center;
      gap: 8px;
      font-size: 1.125rem;
    }
    ul {
      margin: 0 0 8px;
      padding-left: 1.25rem;
    }
    .defer {
      margin: 0;
      font-weight: 600;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourCautions {
  readonly materialKind = input.required<MaterialKindName>();

  protected readonly cautions = computed(() => safetyCautions(this.materialKind()));
  protected readonly deference = DEFERENCE_NOTE;
}
