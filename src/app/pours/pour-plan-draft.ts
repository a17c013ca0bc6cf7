import { Injectable, inject } from '@angular/core';
import { displayUnitsFor, type DisplayUnits } from '@benchtide/shared';
import { format } from 'date-fns';
import { DevicePreferences } from '../core/device-preferences';
import { convertFields, createPourForm, presetFields, type PourFormValue } from './pour-form';

const STORAGE_KEY = 'benchtide.pour-plan-draft';

interface StoredDraft {
  units: DisplayUnits;
  value: Partial<PourFormValue>;
}

/** The planner's last inputs, kept on the device so a repeat pour starts where the last one ended. */
@Injectable({ providedIn: 'root' })
export class PourPlanDraft {
  private readonly preferences = inject(DevicePreferences);

  readonly form = createPourForm();
  /** The units the form's numbers are typed in; the form outlives the planner, the device's units may change. */
  units: DisplayUnits;

  constructor() {
    const { unitSystem, temperatureUnit } = this.preferences.values();
    const units: DisplayUnits = { ...displayUnitsFor(unitSystem), temperature: temperatureUnit };
    const metric = displayUnitsFor('metric');
    const stored = this.load();
    this.units = units;
    if (stored) {
      this.form.patchValue(stored.value);
      this.form.patchValue(convertFields(this.form.getRawValue(), stored.units, units));
    } else {
      this.form.patchValue({ length: '120', width: '45', depth: '6', roomTemp: '20' });
      this.form.patchValue(presetFields(this.form.getRawValue().presetId, metric));
      this.form.patchValue(convertFields(this.form.getRawValue(), metric, units));
    }
    // A plan is for now unless the modeller sets another time.
    this.form.patchValue({ startAt: format(new Date(), "yyyy-MM-dd'T'HH:mm") });
  }

  save(value: PourFormValue, units: DisplayUnits): void {
    try {
      localStorage.setItem(STORAGE_KEY, JSON.stringify({ units, value } satisfies StoredDraft));
    } catch {
      // Storage full or blocked: the draft lives for this visit only.
    }
  }

  private load(): StoredDraft | null {
    try {
      const stored = JSON.parse(localStorage.getItem(STORAGE_KEY) ?? 'null') as Partial<StoredDraft> | null;
      if (!stored?.units || !stored.value || typeof stored.value !== 'object') return null;
      const known = Object.keys(this.form.controls);
      const value = Object.fromEntries(
        Object.entries(stored.value).filter(([key, field]) => known.includes(key) && typeof field === 'string'),
      ) as Partial<PourFormValue>;
      return { units: stored.units, value };
    } catch {
      return null;
    }
  }
}
