import type { Provider } from '@angular/core';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS, type MatFormFieldDefaultOptions } from '@angular/material/form-field';

/**
 * Hints and plain-language errors take the room they need instead of overflowing on a phone.
 * Provided by each screen with forms (not app-wide), so the form-field code stays out of the
 * first download.
 */
export const ROOMY_FORM_FIELDS: Provider = {
  provide: MAT_FORM_FIELD_DEFAULT_OPTIONS,
  useValue: { subscriptSizing: 'dynamic' } satisfies MatFormFieldDefaultOptions,
};
