import { Injectable, effect, signal } from '@angular/core';
import type { TemperatureUnit, UnitSystem } from '@benchtide/shared';

export interface DevicePreferenceValues {
  unitSystem: UnitSystem;
  temperatureUnit: TemperatureUnit;
  /** The finest step the modeller's kitchen scale reads, in grams. */
  scaleResolutionG: number;
  /** The finest mark on the mixing cup or syringe, in millilitres. */
  cupResolutionMl: number;
  /** The money new containers are priced in (ISO 4217 code). */
  currency: string;
  /** Light or dark, or as the device is set. */
  theme: ThemeChoice;
}

export type ThemeChoice = 'system' | 'light' | 'dark';

const STORAGE_KEY = 'benchtide.device-preferences';
const DEFAULTS: DevicePreferenceValues = {
  unitSystem: 'metric',
  temperatureUnit: 'C',
  scaleResolutionG: 0.1,
  cupResolutionMl: 1,
  currency: 'EUR',
  theme: 'system',
};
const THEMES: readonly ThemeChoice[] = ['system', 'light', 'dark'];
export const SCALE_RESOLUTIONS_G = [0.01, 0.1, 1] as const;
/** Marks a bench has: a syringe (0.1 mL), small and large mixing cups. */
export const CUP_RESOLUTIONS_ML = [0.1, 0.5, 1, 2, 5, 10] as const;

/** Choices that belong to this device (units, the scale on this bench), kept in local storage. */
@Injectable({ providedIn: 'root' })
export class DevicePreferences {
  private readonly state = signal<DevicePreferenceValues>(load());

  readonly values = this.state.asReadonly();

  constructor() {
    // The stylesheet follows color-scheme (light-dark()), so one property switches the whole theme.
    effect(() => {
      const { theme } = this.state();
      document.documentElement.style.colorScheme = theme === 'system' ? '' : theme;
    });
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
      cupResolutionMl: CUP_RESOLUTIONS_ML.find((step) => step === stored.cupResolutionMl) ?? DEFAULTS.cupResolutionMl,
      currency:
        typeof stored.currency === 'string' && /^[A-Z]{3}$/.test(stored.currency) ? stored.currency : DEFAULTS.currency,
      theme: THEMES.find((theme) => theme === stored.theme) ?? DEFAULTS.theme,
    };
  } catch {
    return { ...DEFAULTS };
  }
}
