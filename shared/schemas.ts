/**
 * Validation shared by the pour form and the server, with messages a modeller can act on.
 * Impossible values (negative depth, a zero ratio, density 0, NaN, Infinity) never reach the maths.
 */
import * as z from 'zod';
import { polygonAreaMm2 } from './pour-volume.js';

const MIN_TEMP_C = -30;
const MAX_TEMP_C = 60;

function finiteNumber(label: string) {
  // zod 4 numbers already refuse NaN and Infinity; this gives the refusal plain words.
  return z.number({
    error: (issue) => (issue.input === undefined ? `${label} is required` : `${label} must be a number`),
  });
}

function zeroIn(unit: string): string {
  return unit === '' ? '0' : `0 ${unit}`;
}

function moreThanZero(label: string, unit: string) {
  return finiteNumber(label).gt(0, { error: `${label} must be more than ${zeroIn(unit)}` });
}

function zeroOrMore(label: string, unit: string) {
  return finiteNumber(label).min(0, { error: `${label} must be ${zeroIn(unit)} or more` });
}

function temperature(label: string) {
  const message = `${label} must be between ${MIN_TEMP_C} and ${MAX_TEMP_C} °C`;
  return finiteNumber(label).min(MIN_TEMP_C, { error: message }).max(MAX_TEMP_C, { error: message });
}

export const mixRatioSchema = z.object(
  {
    basis: z.enum(['volume', 'weight'], { error: 'Choose whether the ratio is by weight or by volume' }),
    partA: moreThanZero('Part A of the ratio', ''),
    partB: zeroOrMore('Part B of the ratio', '').optional(),
  },
  { error: 'Enter the mix ratio from the data sheet' },
);

export const materialDataSheetSchema = z
  .object(
    {
      name: z.string().trim().max(200, { error: 'Name must be at most 200 characters' }).optional(),
      mixRatio: mixRatioSchema,
      densityAGPerMl: moreThanZero('Part A density', 'g/mL'),
      densityBGPerMl: moreThanZero('Part B density', 'g/mL').optional(),
      potLifeMin: moreThanZero('Pot life', 'min'),
      recoatMin: moreThanZero('Recoat time', 'min'),
      recoatMaxMin: moreThanZero('End of the recoat window', 'min').optional(),
      demouldMin: moreThanZero('Demould time', 'min'),
      fullCureMin: moreThanZero('Full cure time', 'min'),
      referenceTempC: temperature('Data-sheet temperature'),
      minCureTempC: temperature('Minimum cure temperature'),
      maxLayerMm: moreThanZero('Maximum layer', 'mm'),
      /** How far off the mix ratio the maker allows, when the data sheet says. */
      ratioTolerancePercent: moreThanZero('Ratio tolerance', '%').max(50, { error: 'Ratio tolerance must be at most 50 %' }).optional(),
    },
    { error: 'Choose a material and fill in its data sheet' },
  )
  .superRefine((sheet, ctx) => {
    if ((sheet.mixRatio.partB ?? 0) > 0 && sheet.densityBGPerMl === undefined) {
      ctx.addIssue({ code: 'custom', path: ['densityBGPerMl'], message: 'Part B density must be more than 0 g/mL' });
    }
    if (sheet.recoatMaxMin !== undefined && sheet.recoatMaxMin < sheet.recoatMin) {
      ctx.addIssue({
        code: 'custom',
        path: ['recoatMaxMin'],
        message: 'The end of the recoat window must not come before the earliest recoat time',
      });
    }
    if (sheet.fullCureMin < sheet.demouldMin) {
      ctx.addIssue({
        code: 'custom',
        path: ['fullCureMin'],
        message: 'Full cure must take at least as long as demoulding',
      });
    }
    if (sheet.minCureTempC > sheet.referenceTempC) {
      ctx.addIssue({
        code: 'custom',
        path: ['minCureTempC'],
        message: 'Minimum cure temperature must not be above the data-sheet temperature',
      });
    }
  });

/** Common practice: past this a pour is no longer a handful of layers but a mistake in the depth or layer. */
export const MAX_LAYERS = 50;

export const layerCountSchema = finiteNumber('Number of layers')
  .int({ error: 'Number of layers must be a whole number' })
  .min(1, { error: 'A pour needs at least 1 layer' })
  .max(MAX_LAYERS, { error: `A pour can have at most ${MAX_LAYERS} layers` });

const pointSchema = z.object({ xMm: finiteNumber('Point position'), yMm: finiteNumber('Point position') });

export const pourShapeSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('rectangle'),
      lengthMm: moreThanZero('Length', 'mm'),
      widthMm: moreThanZero('Width', 'mm'),
    }),
    z.object({ kind: z.literal('circle'), diameterMm: moreThanZero('Diameter', 'mm') }),
    z.object({
      kind: z.literal('ellipse'),
      lengthMm: moreThanZero('Length', 'mm'),
      widthMm: moreThanZero('Width', 'mm'),
    }),
    z
      .object({
        kind: z.literal('polygon'),
        points: z
          .array(pointSchema)
          .min(3, { error: 'A traced outline needs at least 3 points' })
          .max(10_000, { error: 'A traced outline can have at most 10000 points' }),
      })
      .refine((shape) => shape.points.length < 3 || polygonAreaMm2(shape.points) > 0, {
        error: 'The traced outline has no area: its points lie on one line',
        path: ['points'],
      }),
    z.object({ kind: z.literal('area'), areaMm2: moreThanZero('Area', 'mm²') }),
  ],
  { error: 'Choose a shape: rectangle, circle, ellipse, traced outline or area' },
);

export const pourPlanRequestSchema = z.object(
  {
    shape: pourShapeSchema,
    depthMm: moreThanZero('Depth', 'mm'),
    displacedMl: zeroOrMore('Displaced volume', 'mL').default(0),
    wastePercent: zeroOrMore('Waste allowance', '%')
      .max(100, { error: 'Waste allowance must be at most 100 %' })
      .default(0),
    material: materialDataSheetSchema,
    roomTempC: temperature('Room temperature'),
    startAtMs: finiteNumber('Start time')
      .int({ error: 'Start time must be a whole number of milliseconds' })
      .min(0, { error: 'Start time must not be before 1970' }),
    scaleResolutionG: moreThanZero('Scale resolution', 'g'),
    cupResolutionMl: moreThanZero('Cup resolution', 'mL').default(1),
    /** More layers than the fewest the maximum layer allows: thin detail or tinted layers. */
    layerCount: layerCountSchema.optional(),
  },
  { error: 'A pour plan needs a shape, depth, material and room temperature' },
);

export type MixRatioInput = z.input<typeof mixRatioSchema>;
export type MaterialDataSheet = z.output<typeof materialDataSheetSchema>;
export type PourShapeInput = z.input<typeof pourShapeSchema>;
/** What a form or client sends: defaults may be left out. */
export type PourPlanRequestInput = z.input<typeof pourPlanRequestSchema>;
/** After validation, defaults filled in. */
export type PourPlanRequest = z.output<typeof pourPlanRequestSchema>;
/** A data sheet as a form or client sends it. */
export type MaterialDataSheetInput = z.input<typeof materialDataSheetSchema>;
