/**
 * The records of the craft as forms, the API and sync exchange them: builds, their log of steps,
 * materials and the containers (lots) on the shelf, and pours. Ids are made on the device that
 * creates a record (UUID v7), so the same record can be written offline and synced later.
 */
import * as z from 'zod';
import { layerCountSchema, materialDataSheetSchema, pourShapeSchema } from './schemas.js';
import {
  isPourableUnit,
  STOCK_DIMENSIONS,
  STOCK_UNITS,
  unitMismatch,
  type StockDimension,
  type StockUnit,
} from './stock-units.js';

const id = (label: string) => z.uuid({ error: `${label} must be an id made by the app` });
// A NUL character cannot be stored as text; refusing it here keeps it from failing a whole sync batch.
const text = (label: string, max: number) =>
  z
    .string({ error: `${label} must be text` })
    .trim()
    .max(max, { error: `${label} must be at most ${max} characters` })
    .refine((value) => !value.includes('\u0000'), { error: `${label} contains a character that cannot be stored` });
const requiredText = (label: string, max: number) => text(label, max).min(1, { error: `${label} is required` });
const positive = (label: string, unit: string) =>
  z
    .number({ error: `${label} must be a number` })
    .gt(0, { error: `${label} must be more than 0${unit ? ` ${unit}` : ''}` });
// The stock book keeps amounts exact to a thousandth in a column that holds less than 10^11.
export const MAX_STOCK_AMOUNT = 1_000_000_000;
const stockAmount = (schema: z.ZodNumber, label: string) =>
  schema.max(MAX_STOCK_AMOUNT, { error: `${label} must be at most ${MAX_STOCK_AMOUNT.toLocaleString('en')}` });
const instant = (label: string) => z.iso.datetime({ offset: true, error: `${label} must be a date and time` });
const day = (label: string) => z.iso.date({ error: `${label} must be a date (YYYY-MM-DD)` });

export const BUILD_STATUSES = ['planning', 'building', 'finished'] as const;
export const STEP_KINDS = ['base-and-terrain', 'painting', 'water-pour', 'detailing', 'other'] as const;
/** What is poured: planned from its data sheet, drawn by weight or volume. */
export const POUR_MATERIAL_KINDS = ['two-part-epoxy', 'single-part-medium', 'water-gel'] as const;
export const MATERIAL_KINDS = [
  ...POUR_MATERIAL_KINDS,
  'foam-and-boards',
  'plaster-and-fillers',
  'paints-and-washes',
  'scenic',
  'kits-figures-details',
  'track',
  'adhesives',
  'other',
] as const;
export type MaterialKindName = (typeof MATERIAL_KINDS)[number];

/** Each kind in the trade's plain words, as the shelf and the cost report name it. */
export const MATERIAL_KIND_WORDS: Readonly<Record<MaterialKindName, string>> = {
  'two-part-epoxy': 'Two-part epoxy',
  'single-part-medium': 'Single-part medium',
  'water-gel': 'Water gel',
  'foam-and-boards': 'Foam and boards',
  'plaster-and-fillers': 'Plaster and fillers',
  'paints-and-washes': 'Paints and washes',
  scenic: 'Scenic materials',
  'kits-figures-details': 'Kits, figures and details',
  track: 'Track',
  adhesives: 'Adhesives',
  other: 'Other',
};

export function isPourMaterialKind(kind: string): boolean {
  return (POUR_MATERIAL_KINDS as readonly string[]).includes(kind);
}

/** How a material is kept, for the checks below: poured by its data sheet, or measured in one dimension. */
export interface MaterialMeasure {
  readonly kind: MaterialKindName;
  readonly dataSheet?: unknown;
  readonly measure?: StockDimension | null;
}

/** Where a material's measure does not hold together, and why, or null. */
export function materialMeasureProblem(material: MaterialMeasure): { path: string; message: string } | null {
  const poured = material.dataSheet !== undefined && material.dataSheet !== null;
  if (isPourMaterialKind(material.kind) && !poured) {
    return { path: 'dataSheet', message: 'A pour material needs the values from its data sheet, to plan its pours.' };
  }
  if (!poured && !material.measure) {
    return { path: 'measure', message: 'Say how it is bought and used: by weight, volume, pieces, length or area.' };
  }
  return null;
}

/** Why a container's unit does not fit its material, or null: a poured material by weight or volume, the rest by their measure. */
export function containerUnitProblem(material: MaterialMeasure, unit: StockUnit): string | null {
  if (material.dataSheet !== undefined && material.dataSheet !== null) {
    return isPourableUnit(unit) ? null : 'A pour material is kept by weight or volume: choose g, kg, mL or L.';
  }
  return material.measure ? unitMismatch(unit, material.measure) : null;
}
/** A low mark needs both its amount and a unit that fits how the material is measured. */
export function lowMarkProblem(
  material: MaterialMeasure & { lowMarkQty?: number | null; lowMarkUnit?: StockUnit | null },
): { path: string; message: string } | null {
  const { lowMarkQty, lowMarkUnit } = material;
  if (lowMarkQty == null) return null;
  if (lowMarkUnit == null) return { path: 'lowMarkUnit', message: 'Choose the unit of the low mark' };
  const misfit = containerUnitProblem(material, lowMarkUnit);
  return misfit ? { path: 'lowMarkUnit', message: misfit } : null;
}

export const CONTAINER_PARTS = ['A', 'B', 'single'] as const;

const buildFields = {
  name: requiredText('Name', 120),
  scaleRatio: positive('Scale', ''),
  /** The standard scale chosen, if any (shared/scale.ts ids); absent for a custom ratio. */
  scaleId: text('Scale', 40).optional(),
  baseWidthMm: positive('Base width', 'mm').optional(),
  baseDepthMm: positive('Base depth', 'mm').optional(),
  realWidthMm: positive('Real width', 'mm').optional(),
  realDepthMm: positive('Real depth', 'mm').optional(),
  status: z.enum(BUILD_STATUSES, { error: 'Status must be planning, building or finished' }),
  notes: text('Notes', 10_000),
  /** The photo shown on the build's card; null takes it off. */
  coverPhotoId: z.uuid({ error: 'Cover must be a photo of this build' }).nullish(),
};
export const newBuildSchema = z.object({ id: id('Build'), ...buildFields, notes: buildFields.notes.default('') });
export const buildPatchSchema = z.object(buildFields).partial();

const stepFields = {
  kind: z.enum(STEP_KINDS, { error: 'Choose what kind of step this is' }),
  title: requiredText('Title', 200),
  notes: text('Notes', 10_000),
  happenedAt: instant('When'),
  /** Time spent at the bench on this step, when the modeller notes it; summed per build. */
  minutesSpent: z
    .int({ error: 'Time spent must be a whole number of minutes' })
    .min(0, { error: 'Time spent must be 0 minutes or more' })
    .max(100_000, { error: 'Time spent must be at most 100,000 minutes' })
    .nullish(),
};
export const newStepSchema = z.object({
  id: id('Step'),
  buildId: id('Build'),
  ...stepFields,
  notes: stepFields.notes.default(''),
});
export const stepPatchSchema = z.object(stepFields).partial();

const materialFields = {
  name: requiredText('Name', 120),
  kind: z.enum(MATERIAL_KINDS, { error: 'Choose the kind of material' }),
  /** Only what is poured has one; null for foam, paint, figures and the rest. */
  dataSheet: materialDataSheetSchema.nullable(),
  /** How a material without a data sheet is bought and used: by weight, volume, pieces, length or area. */
  measure: z
    .enum(STOCK_DIMENSIONS, {
      error: 'Measure must be by weight, volume, pieces, length or area',
    })
    .nullable(),
  shelfLifeOpenedDays: z
    .int({ error: 'Shelf life once opened must be a whole number of days' })
    .positive({ error: 'Shelf life once opened must be more than 0 days' })
    .optional(),
  /** A link to the maker's safety data sheet, or where the paper copy is. */
  safetySheet: text('Safety data sheet', 500),
  /** Buy more when all its containers together hold this much or less, in lowMarkUnit. */
  lowMarkQty: stockAmount(
    z.number({ error: 'Low mark must be a number' }).min(0, { error: 'Low mark must be 0 or more' }),
    'Low mark',
  ).nullish(),
  lowMarkUnit: z.enum(STOCK_UNITS, { error: `Low mark unit must be one of ${STOCK_UNITS.join(', ')}` }).nullish(),
};
// The default belongs to a new material only: on a patch it would blank a sheet the change never touched.
export const newMaterialSchema = z
  .object({
    id: id('Material'),
    ...materialFields,
    dataSheet: materialFields.dataSheet.default(null),
    measure: materialFields.measure.default(null),
    safetySheet: materialFields.safetySheet.default(''),
  })
  .superRefine((material, context) => {
    const problem = materialMeasureProblem(material) ?? lowMarkProblem(material);
    if (problem) context.addIssue({ code: 'custom', path: [problem.path], message: problem.message });
  });
export const materialPatchSchema = z.object(materialFields).partial();

const containerFields = {
  materialId: id('Material'),
  part: z.enum(CONTAINER_PARTS, { error: 'Part must be A, B or single' }),
  sizeQty: stockAmount(positive('Size', ''), 'Size'),
  unit: z.enum(STOCK_UNITS, { error: `Unit must be one of ${STOCK_UNITS.join(', ')}` }),
  priceMinor: z.int({ error: 'Price must be a whole number of cents' }).min(0, { error: 'Price must be 0 or more' }),
  currency: z.string().regex(/^[A-Z]{3}$/, { error: 'Currency must be a three-letter code such as EUR' }),
  boughtOn: day('Bought on'),
  openedOn: day('Opened on').optional(),
  useBy: day('Use by').optional(),
  lowStockQty: z
    .number({ error: 'Low-stock level must be a number' })
    .min(0, { error: 'Low-stock level must be 0 or more' })
    .optional(),
  lot: text('Lot', 80).optional(),
  /** Bought for one build alone (a kit for it): its cost is that build's, and the shelf says so. */
  forBuildId: z.uuid({ error: 'Bought for must be a build of this workshop' }).nullish(),
};
export const newContainerSchema = z.object({ id: id('Container'), ...containerFields });
export const containerPatchSchema = z
  .object(containerFields)
  .omit({ materialId: true, sizeQty: true, unit: true })
  .partial();

export const wasteSchema = z.object({
  id: id('Entry'),
  quantity: stockAmount(positive('Amount', ''), 'Amount'),
  note: text('Note', 500).default(''),
});
/** What a build step took from a container: costed like a pour's use, charged to the step's build. */
export const stepUseSchema = z.object({
  id: id('Entry'),
  stepId: id('Step'),
  quantity: stockAmount(positive('Amount used', ''), 'Amount used'),
  note: text('Note', 500).default(''),
});
export const stocktakeSchema = z.object({
  id: id('Entry'),
  countedQty: stockAmount(
    z.number({ error: 'Counted amount must be a number' }).min(0, { error: 'Counted amount must be 0 or more' }),
    'Counted amount',
  ),
});

export const newPourSchema = z.object({
  id: id('Pour'),
  buildId: id('Build'),
  stepId: id('Step').optional(),
  materialId: id('Material'),
  shape: pourShapeSchema,
  depthMm: positive('Depth', 'mm'),
  displacedMl: z.number().min(0, { error: 'Displaced volume must be 0 mL or more' }).default(0),
  wastePercent: z
    .number()
    .min(0, { error: 'Waste allowance must be 0 % or more' })
    .max(100, { error: 'Waste allowance must be at most 100 %' })
    .default(0),
  roomTempC: z.number({ error: 'Room temperature must be a number' }).min(-30).max(60),
  startAt: instant('Start'),
  scaleResolutionG: positive('Scale resolution', 'g').default(0.1),
  /** The finest mark on the cup the parts are measured in; the millilitres shown are rounded to it. */
  cupResolutionMl: z
    .number({ error: 'Cup resolution must be a number' })
    .min(0.01, { error: 'Cup resolution must be at least 0.01 mL' })
    .max(100, { error: 'Cup resolution must be at most 100 mL' })
    .default(1),
  /** Draw from these containers, in this order; otherwise oldest first. */
  containerIds: z.array(id('Container')).max(20).optional(),
  /** When the shelf holds less than the pour needs: refuse, or record the rest as from a bottle not on the shelf. */
  whenShort: z.enum(['refuse', 'record-shortfall'], { error: 'Choose refuse or record-shortfall' }).default('refuse'),
  note: text('Note', 2000).default(''),
  /** More layers than the fewest the maximum layer thickness allows: thin detail or tinted layers. */
  layerCount: layerCountSchema.optional(),
});

/** A pour corrected after it was logged: its note, or the number of layers now planned (add, skip, re-split). */
export const pourPatchSchema = z
  .object({ note: text('Note', 2000), layerCount: layerCountSchema })
  .partial()
  .refine((patch) => patch.note !== undefined || patch.layerCount !== undefined, {
    error: 'Change the note or the number of layers',
  });

const roomTemp = z
  .number({ error: 'Room temperature must be a number' })
  .min(-30, { error: 'Room temperature must be at least -30 °C' })
  .max(60, { error: 'Room temperature must be at most 60 °C' });
const weighed = (part: string) => stockAmount(positive(`Weighed part ${part}`, 'g'), `Weighed part ${part}`).nullable();

const layerFields = {
  pouredAt: instant('Poured at'),
  roomTempC: roomTemp,
  /** What was really weighed; absent or null when the plan's amounts were used. */
  weighedAG: weighed('A'),
  weighedBG: weighed('B'),
  /** Tint, pigment, what was embedded. */
  note: text('Note', 2000),
};
/** A layer recorded as poured: the layer after the last one on. Layer 1 comes with the pour. */
export const newPourLayerSchema = z.object({
  id: id('Layer'),
  pourId: id('Pour'),
  number: z
    .int({ error: 'Layer must be a whole number' })
    .min(2, { error: 'Layer 1 is recorded with the pour' })
    .max(50, { error: 'A pour can have at most 50 layers' }),
  ...layerFields,
  weighedAG: layerFields.weighedAG.optional(),
  weighedBG: layerFields.weighedBG.optional(),
  note: layerFields.note.default(''),
});
export const pourLayerPatchSchema = z
  .object(layerFields)
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, { error: 'Change at least one thing about the layer' });

export type NewBuild = z.input<typeof newBuildSchema>;
export type NewStep = z.input<typeof newStepSchema>;
export type NewMaterial = z.input<typeof newMaterialSchema>;
export type NewContainer = z.input<typeof newContainerSchema>;
export type NewPour = z.input<typeof newPourSchema>;
export type NewPourLayer = z.input<typeof newPourLayerSchema>;
export type PourLayerPatch = z.input<typeof pourLayerPatchSchema>;
export type PourPatch = z.input<typeof pourPatchSchema>;
