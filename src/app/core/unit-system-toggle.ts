import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import type { UnitSystem } from '@benchtide/shared';
import { DevicePreferences } from './device-preferences';

/** Metric or imperial for every number on the screen; remembered on this device. */
@Component({
  selector: 'bt-unit-system-toggle',
  imports: [MatButtonToggleModule],
  template: `
    <mat-button-toggle-group
      aria-label="Units"
      hideSingleSelectionIndicator
      [value]="unitSystem()"
      (change)="choose($event.value)"
    >
      <mat-button-toggle value="metric">mm · mL · g · °C</mat-button-toggle>
      <mat-button-toggle value="imperial">in · fl oz · oz · °F</mat-button-toggle>
    </mat-button-toggle-group>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UnitSystemToggle {
  private readonly preferences = inject(DevicePreferences);

  protected readonly unitSystem = computed(() => this.preferences.values().unitSystem);

  protected choose(unitSystem: UnitSystem): void {
    this.preferences.update({ unitSystem, temperatureUnit: unitSystem === 'imperial' ? 'F' : 'C' });
  }
}
