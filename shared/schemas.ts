/**
 * Validation shared by the pour form and the server, with messages a modeller can act on.
 * Impossible values (negative depth, a zero ratio, density 0, NaN, Infinity) never reach the maths.
 */
import * as z from 'zod';
import { allOnOneLine, crossingMessage, outlineCrossing } from './outline.js';

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

/** Common practice: no diorama base or pour runs past 10 m; beyond it a value is a slip of the keyboard. */
export const MAX_DIMENSION_MM = 10_000;
const MAX_AREA_MM2 = MAX_DIMENSION_MM ** 2;
/** A year: no data-sheet time runs longer. */
const MAX_MINUTES = 525_600;

function dimension(label: string) {
  return moreThanZero(label, 'mm').max(MAX_DIMENSION_MM, {
    error: `${label} must be at most 10 m (${MAX_DIMENSION_MM} mm)`,
  });
}

/** From memory: casting materials run from about 0.7 g/mL (foamed) to under 3 g/mL (filled); 25 is past any metal but osmium. */
function density(label: string) {
  return finiteNumber(label)
    .gt(0, { error: `${label} must be more than 0 g/mL`, abort: true })
    .min(0.05, { error: `${label} must be at least 0.05 g/mL` })
    .max(25, { error: `${label} must be at most 25 g/mL` });
}

function minutes(label: string) {
  return moreThanZero(label, 'min').max(MAX_MINUTES, {
    error: `${label} must be at most 365 days (${MAX_MINUTES} min)`,
  });
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
    partA: moreThanZero('Part A of the ratio', '').max(1000, { error: 'Part A of the ratio must be at most 1000' }),
    partB: zeroOrMore('Part B of the ratio', '')
      .max(1000, { error: 'Part B of the ratio must be at most 1000' })
      .optional(),
  },
  { error: 'Enter the mix ratio from the data sheet' },
);

export const materialDataSheetSchema = z
  .object(
    {
      name: z.string().trim().max(200, { error: 'Name must be at most 200 characters' }).optional(),
      mixRatio: mixRatioSchema,
      densityAGPerMl: density('Part A density'),
      densityBGPerMl: density('Part B density').optional(),
      potLifeMin: minutes('Pot life'),
      recoatMin: minutes('Recoat time'),
      recoatMaxMin: minutes('End of the recoat window').optional(),
      demouldMin: minutes('Demould time'),
      fullCureMin: minutes('Full cure time'),
      referenceTempC: temperature('Data-sheet temperature'),
      minCureTempC: temperature('Minimum cure temperature'),
      maxLayerMm: dimension('Maximum layer'),
      /** How far off the mix ratio the maker allows, when the data sheet says. */
      ratioTolerancePercent: moreThanZero('Ratio tolerance', '%')
        .max(50, { error: 'Ratio tolerance must be at most 50 %' })
        .optional(),
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

const coordinate = finiteNumber('Point position')
  .min(-MAX_DIMENSION_MM, { error: 'Points must lie within 10 m of the first corner' })
  .max(MAX_DIMENSION_MM, { error: 'Points must lie within 10 m of the first corner' });
const pointSchema = z.object({ xMm: coordinate, yMm: coordinate });

export const pourShapeSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('rectangle'),
      lengthMm: dimension('Length'),
      widthMm: dimension('Width'),
    }),
    z.object({ kind: z.literal('circle'), diameterMm: dimension('Diameter') }),
    z.object({
      kind: z.literal('ellipse'),
      lengthMm: dimension('Length'),
      widthMm: dimension('Width'),
    }),
    z
      .object({
        kind: z.literal('polygon'),
        points: z
          .array(pointSchema)
          .min(3, { error: 'A traced outline needs at least 3 points' })
          .max(10_000, { error: 'A traced outline can have at most 10000 points' }),
      })
      .superRefine((shape, ctx) => {
        if (shape.points.length < 3) return;
        if (allOnOneLine(shape.points)) {
          ctx.addIssue({
            code: 'custom',
            path: ['points'],
            message: 'The traced outline has no area: its points lie on one line',
          });
          return;
        }
        const crossing = outlineCrossing(shape.points);
        if (crossing) ctx.addIssue({ code: 'custom', path: ['points'], message: crossingMessage(crossing) });
      }),
    z.object({
      kind: z.literal('area'),
      areaMm2: moreThanZero('Area', 'mm²').max(MAX_AREA_MM2, { error: 'Area must be at most 100 m² (10 m by 10 m)' }),
    }),
  ],
  { error: 'Choose a shape: rectangle, circle, ellipse, traced outline or area' },
);

const LATEST_START_MS = Date.UTC(2200, 0, 1);

export const pourPlanRequestSchema = z.object(
  {
    shape: pourShapeSchema,
    depthMm: dimension('Depth'),
    displacedMl: zeroOrMore('Displaced volume', 'mL')
      .max((MAX_AREA_MM2 * MAX_DIMENSION_MM) / 1000, {
        error: 'Displaced volume must be at most 1000000000 mL (a 10 m by 10 m base 10 m deep)',
      })
      .default(0),
    wastePercent: zeroOrMore('Waste allowance', '%')
      .max(100, { error: 'Waste allowance must be at most 100 %' })
      .default(0),
    material: materialDataSheetSchema,
    roomTempC: temperature('Room temperature'),
    startAtMs: finiteNumber('Start time')
      .int({ error: 'Start time must be a whole number of milliseconds' })
      .min(0, { error: 'Start time must not be before 1970' })
      .max(LATEST_START_MS, { error: 'Start time must be before the year 2200' }),
    scaleResolutionG: finiteNumber('Scale resolution')
      .min(0.001, { error: 'Scale resolution must be at least 0.001 g' })
      .max(100, { error: 'Scale resolution must be at most 100 g' }),
    cupResolutionMl: finiteNumber('Cup resolution')
      .min(0.01, { error: 'Cup resolution must be at least 0.01 mL' })
      .max(100, { error: 'Cup resolution must be at most 100 mL' })
      .default(1),
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
