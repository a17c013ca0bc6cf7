import { ChangeDetectionStrategy, Component, computed, input, linkedSignal, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MAX_FUTURE_MS } from '@benchtide/shared';
import { format, isSameDay } from 'date-fns';
import { inputText, parseDecimal } from '../core/decimal-input';

export interface ChosenPour {
  readonly pouredAtMs: number;
  readonly roomTempC: number;
}

const DAY_MS = 86_400_000;

/**
 * The moment a clock time means: today, or yesterday when today's would be more than an hour ahead
 * (a layer recorded after midnight for one poured before it).
 */
export function pouredAtOf(clock: string, nowMs: number): number | null {
  const match = /^(\d{1,2}):(\d{2})$/.exec(clock.trim());
  if (!match) return null;
  const day = new Date(nowMs);
  day.setHours(Number(match[1]), Number(match[2]), 0, 0);
  const atMs = day.getTime();
  return atMs > nowMs + MAX_FUTURE_MS ? atMs - DAY_MS : atMs;
}

/** When a layer really went on and how warm the room was, for a layer recorded after the fact. */
@Component({
  selector: 'bt-layer-time-chooser',
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule],
  template: `
    <div class="chooser" role="group" [attr.aria-label]="'When layer ' + layer() + ' was poured'">
      <div class="fields">
        <mat-form-field>
          <mat-label>Poured at</mat-label>
          <input matInput type="time" name="pouredAt" [value]="clock()" (input)="clock.set(text($event))" />
        </mat-form-field>
        <mat-form-field>
          <mat-label>Room temperature</mat-label>
          <input
            matInput
            name="roomTempC"
            inputmode="decimal"
            autocomplete="off"
            [value]="roomText()"
            (input)="roomText.set(text($event))"
          />
          <span matTextSuffix>°C</span>
        </mat-form-field>
      </div>
      <p class="said" aria-live="polite">{{ said() }}</p>
      <div class="actions">
        <button mat-button type="button" (click)="cancelled.emit()">Cancel</button>
        <button mat-flat-button type="button" data-action="record-at" (click)="record()">
          Record layer {{ layer() }}
        </button>
      </div>
    </div>
  `,
  styles: `
    .chooser {
      display: flex;
      flex-direction: column;
      gap: 4px;
    }
    .fields {
      display: flex;
      flex-wrap: wrap;
      gap: 0 12px;
    }
    .fields mat-form-field {
      flex: 1 1 140px;
    }
    .said {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .actions {
      display: flex;
      justify-content: flex-end;
      gap: 8px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LayerTimeChooser {
  readonly layer = input.required<number>();
  /** The room of the layer below: the likeliest for this one. */
  readonly roomTempC = input.required<number>();
  /** When the chooser opened: the time it starts at. */
  readonly openedAtMs = input.required<number>();
  readonly chosen = output<ChosenPour>();
  readonly cancelled = output<void>();

  protected readonly clock = linkedSignal(() => format(this.openedAtMs(), 'HH:mm'));
  protected readonly roomText = linkedSignal(() => String(this.roomTempC()));
  protected readonly text = inputText;
  private readonly pouredAtMs = computed(() => pouredAtOf(this.clock(), this.openedAtMs()));
  private readonly room = computed(() => parseDecimal(this.roomText()));
  protected readonly said = computed(() => {
    const atMs = this.pouredAtMs();
    if (atMs === null) return 'Give the time it was poured, as hours and minutes.';
    if (this.room() === null) return 'Give the room temperature as a number, in °C.';
    const day = isSameDay(atMs, this.openedAtMs()) ? '' : ' yesterday';
    return `Layer ${this.layer()} poured at ${format(atMs, 'HH:mm')}${day}, room at ${this.room()} °C.`;
  });

  protected record(): void {
    const pouredAtMs = this.pouredAtMs();
    const roomTempC = this.room();
    if (pouredAtMs === null || roomTempC === null) return;
    this.chosen.emit({ pouredAtMs, roomTempC });
  }
}
