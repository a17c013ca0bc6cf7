import { Injectable, effect, signal } from '@angular/core';
import type { TemperatureUnit, UnitSystem } from '@benchtide/shared';

export interface DevicePreferenceValues {
  unitSystem: UnitSystem;
  temperatureUnit: TemperatureUnit;
  /** The finest step the modeller's kitchen scale reads, in grams. */
  scaleResolutionG: number;
}

const STORAGE_KEY = 'benchtide.device-preferences';
const DEFAULTS: DevicePreferenceValues = { unitSystem: 'metric', temperatureUnit: 'C', scaleResolutionG: 0.1 };
export const SCALE_RESOLUTIONS_G = [0.01, 0.1, 1] as const;

/** Choices that belong to this device (units, the scale on this bench), kept in local storage. */
@Injectable({ providedIn: 'root' })
export class DevicePreferences {
  private readonly state = signal<DevicePreferenceValues>(load());

  readonly values = this.state.asReadonly();

  constructor() {
    effect(() => {
      try {
        localStorage.setItem(STORAGE_KEY, JSON.stringify(this.state()));
      } catch {
        // Private browsing or a full disk: the choice holds for this visit only.
      }
    });
  }

  update(change: Partial<DevicePreferenceValues>): void {
    this.state.update((current) => ({ ...current, ...change }));
  }
}

function load(): DevicePreferenceValues {
  try {
    const stored = JSON.parse(localStorage.getItem(STORAGE_KEY) ?? '{}') as Partial<DevicePreferenceValues>;
    return {
      unitSystem: stored.unitSystem === 'imperial' ? 'imperial' : 'metric',
      temperatureUnit: stored.temperatureUnit === 'F' ? 'F' : 'C',
      scaleResolutionG:
        SCALE_RESOLUTIONS_G.find((step) => step === stored.scaleResolutionG) ?? DEFAULTS.scaleResolutionG,
    };
  } catch {
    return { ...DEFAULTS };
  }
}
