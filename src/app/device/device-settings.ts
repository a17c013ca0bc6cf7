import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { TemperatureUnit } from '@benchtide/shared';
import {
  CUP_RESOLUTIONS_ML,
  DevicePreferences,
  SCALE_RESOLUTIONS_G,
  type ThemeChoice,
} from '../core/device-preferences';
import { UnitSystemToggle } from '../core/unit-system-toggle';

/** Choices that belong to this phone or computer: units, the kitchen scale, money and light or dark. */
@Component({
  selector: 'bt-device-settings',
  imports: [MatButtonToggleModule, MatFormFieldModule, MatInputModule, MatSelectModule, UnitSystemToggle],
  template: `
    <bt-unit-system-toggle />
    <div class="row">
      <mat-form-field>
        <mat-label>Temperatures in</mat-label>
        <mat-select [value]="values().temperatureUnit" (valueChange)="setTemperature($event)">
          <mat-option value="C">°C</mat-option>
          <mat-option value="F">°F</mat-option>
        </mat-select>
      </mat-form-field>
      <mat-form-field>
        <mat-label>My kitchen scale reads to</mat-label>
        <mat-select
          [value]="values().scaleResolutionG"
          (valueChange)="preferences.update({ scaleResolutionG: $event })"
        >
          @for (step of resolutions; track step) {
            <mat-option [value]="step">{{ step }} g</mat-option>
          }
        </mat-select>
      </mat-form-field>
      <mat-form-field>
        <mat-label>My mixing cup is marked every</mat-label>
        <mat-select
          [value]="values().cupResolutionMl"
          (valueChange)="preferences.update({ cupResolutionMl: $event })"
          data-field="cupResolutionMl"
        >
          @for (step of cupMarks; track step) {
            <mat-option [value]="step">{{ step }} mL</mat-option>
          }
        </mat-select>
      </mat-form-field>
      <mat-form-field>
        <mat-label>Currency for new containers</mat-label>
        <input
          matInput
          autocapitalize="characters"
          maxlength="3"
          [value]="values().currency"
          (change)="setCurrency($event)"
          data-field="currency"
        />
        <mat-hint [class.error]="currencyProblem()">{{
          currencyProblem() ?? 'A three-letter code such as EUR, GBP or USD'
        }}</mat-hint>
      </mat-form-field>
    </div>
    <mat-button-toggle-group
      aria-label="Light or dark"
      hideSingleSelectionIndicator
      [value]="values().theme"
      (change)="setTheme($event.value)"
    >
      <mat-button-toggle value="system">As the device</mat-button-toggle>
      <mat-button-toggle value="light">Light</mat-button-toggle>
      <mat-button-toggle value="dark">Dark</mat-button-toggle>
    </mat-button-toggle-group>
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      align-items: flex-start;
      gap: 16px;
    }
    .row {
      display: flex;
      flex-wrap: wrap;
      gap: 4px 12px;
      width: 100%;
    }
    .row mat-form-field {
      flex: 1 1 180px;
    }
    .error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DeviceSettings {
  protected readonly preferences = inject(DevicePreferences);

  protected readonly values = this.preferences.values;
  protected readonly resolutions = SCALE_RESOLUTIONS_G;
  protected readonly cupMarks = CUP_RESOLUTIONS_ML;
  protected readonly currencyProblem = signal<string | null>(null);

  protected setTemperature(temperatureUnit: TemperatureUnit): void {
    this.preferences.update({ temperatureUnit });
  }

  protected setTheme(theme: ThemeChoice): void {
    this.preferences.update({ theme });
  }

  protected setCurrency(event: Event): void {
    const code = (event.target as HTMLInputElement).value.trim().toUpperCase();
    if (!/^[A-Z]{3}$/.test(code) || !isKnownCurrency(code)) {
      this.currencyProblem.set(`"${code}" is not a currency code this browser knows; the last one stays.`);
      return;
    }
    this.currencyProblem.set(null);
    this.preferences.update({ currency: code });
  }
}

function isKnownCurrency(code: string): boolean {
  const known = (Intl as { supportedValuesOf?: (key: string) => string[] }).supportedValuesOf?.('currency');
  return known === undefined || known.includes(code);
}
