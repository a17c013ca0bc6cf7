import { FormControl, FormGroup } from '@angular/forms';
import {
  customScale,
  displayUnitsFor,
  findScale,
  isValidRatio,
  modelToRealMm,
  realToModelMm,
  toMm,
  type LengthUnit,
  type ScaleEntry,
  type UnitSystem,
} from '@benchtide/shared';
import type * as z from 'zod';
import { lengthText, parseDecimal } from '../core/decimal-input';
import type { LocalBuild } from '../sync/synced-records';
import { realLengthUnit, type BuildStatus } from './build-words';

/** Which side of the scale the modeller measured: the base on the bench, or the piece of the real world. */
export type SizeFrom = 'base' | 'real';
export type BuildField = 'name' | 'scale' | 'status' | 'width' | 'depth' | 'notes';

/** Lengths are typed as text in the shown units, so a comma or a half-typed value never throws. */
function text(value = ''): FormControl<string> {
  return new FormControl(value, { nonNullable: true });
}

export function createBuildForm() {
  return new FormGroup({
    name: text(),
    status: new FormControl<BuildStatus>('planning', { nonNullable: true }),
    sizeFrom: new FormControl<SizeFrom>('base', { nonNullable: true }),
    width: text(),
    depth: text(),
    notes: text(),
  });
}

export type BuildForm = ReturnType<typeof createBuildForm>;
export type BuildFormValue = ReturnType<BuildForm['getRawValue']>;

export interface SizeUnits {
  readonly base: LengthUnit;
  readonly real: LengthUnit;
}

export function sizeUnitsFor(system: UnitSystem): SizeUnits {
  return { base: displayUnitsFor(system).length, real: realLengthUnit(system) };
}

export interface BuildSizes {
  baseWidthMm?: number;
  baseDepthMm?: number;
  realWidthMm?: number;
  realDepthMm?: number;
}

/** The sizes a build was saved with, so a field left as it was keeps its exact value, not the rounded text. */
export type SavedSizes = Readonly<Record<keyof BuildSizes, number | null>>;

export const NO_SAVED_SIZES: SavedSizes = {
  baseWidthMm: null,
  baseDepthMm: null,
  realWidthMm: null,
  realDepthMm: null,
};

export function savedSizesOf(build: LocalBuild): SavedSizes {
  return {
    baseWidthMm: build.baseWidthMm ?? null,
    baseDepthMm: build.baseDepthMm ?? null,
    realWidthMm: build.realWidthMm ?? null,
    realDepthMm: build.realDepthMm ?? null,
  };
}

const KEYS = {
  base: { width: 'baseWidthMm', depth: 'baseDepthMm' },
  real: { width: 'realWidthMm', depth: 'realDepthMm' },
} as const;

/** A length as a field shows it, for one side of the scale. */
export function sizeFieldText(mm: number | null | undefined, side: SizeFrom, units: SizeUnits): string {
  return mm === undefined || !Number.isFinite(mm) ? '' : lengthText(mm, units[side]);
}

/** What was typed, in mm: undefined when empty, NaN when it cannot be read; unchanged text keeps the saved value. */
function typedMm(typed: string, saved: number | null, side: SizeFrom, units: SizeUnits): number | undefined {
  if (typed.trim() === '') return undefined;
  if (saved !== null && typed === sizeFieldText(saved, side, units)) return saved;
  const value = parseDecimal(typed);
  return value === null ? Number.NaN : toMm(value, units[side]);
}

/** The typed side as typed and the other side from the scale (base = real / N); only readable sizes are scaled. */
export function sizesFrom(value: BuildFormValue, ratio: number | null, units: SizeUnits, saved: SavedSizes) {
  const side = value.sizeFrom;
  const other: SizeFrom = side === 'base' ? 'real' : 'base';
  const scaled = (mm: number | undefined) => {
    if (mm === undefined || ratio === null || !isValidRatio(ratio) || !(mm > 0)) return undefined;
    return side === 'base' ? modelToRealMm(mm, ratio) : realToModelMm(mm, ratio);
  };
  const sizes: BuildSizes = {};
  for (const dimension of ['width', 'depth'] as const) {
    const typed = typedMm(value[dimension], saved[KEYS[side][dimension]], side, units);
    const derived = scaled(typed);
    if (typed !== undefined) sizes[KEYS[side][dimension]] = typed;
    if (derived !== undefined) sizes[KEYS[other][dimension]] = derived;
  }
  return sizes;
}

/** The fields of a build as the shared schemas check them; an unreadable scale is NaN, so it is refused. */
export function buildFields(value: BuildFormValue, scale: ScaleEntry | null, sizes: BuildSizes) {
  const standard = scale !== null && findScale(scale.id) !== undefined;
  return {
    name: value.name,
    scaleRatio: scale?.ratio ?? Number.NaN,
    ...(standard ? { scaleId: scale.id } : {}),
    ...sizes,
    status: value.status,
    notes: value.notes,
  };
}

/** The scale a build was saved with: its standard entry, or the modeller's own 1:N. */
export function savedScale(build: Pick<LocalBuild, 'scaleId' | 'scaleRatio'>): ScaleEntry | null {
  const standard = build.scaleId ? findScale(build.scaleId) : undefined;
  if (standard && standard.ratio === build.scaleRatio) return standard;
  return isValidRatio(build.scaleRatio) ? customScale(build.scaleRatio) : null;
}

/** The first message for each field of the form, from the schema's issues. */
export function fieldMessages(issues: readonly z.core.$ZodIssue[]): Map<BuildField, string> {
  const messages = new Map<BuildField, string>();
  for (const issue of issues) {
    const field = FIELD_OF[String(issue.path[0] ?? '')];
    if (field !== undefined && !messages.has(field)) messages.set(field, issue.message);
  }
  return messages;
}

const FIELD_OF: Readonly<Record<string, BuildField>> = {
  name: 'name',
  scaleRatio: 'scale',
  scaleId: 'scale',
  status: 'status',
  baseWidthMm: 'width',
  realWidthMm: 'width',
  baseDepthMm: 'depth',
  realDepthMm: 'depth',
  notes: 'notes',
};

/** A size saved before cannot be taken away (a change only sets values), so an emptied field is explained. */
export function emptiedSizes(value: BuildFormValue, saved: SavedSizes): Map<BuildField, string> {
  const messages = new Map<BuildField, string>();
  for (const dimension of ['width', 'depth'] as const) {
    const wasSaved = saved[KEYS[value.sizeFrom][dimension]] !== null;
    if (wasSaved && value[dimension].trim() === '') {
      messages.set(dimension, `The saved ${dimension} cannot be removed; type the ${dimension} it should have`);
    }
  }
  return messages;
}
