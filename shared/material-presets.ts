/**
 * Generic starting points for the pour planner, one per kind of water material. They are
 * typical values from memory, not any maker's figures: every screen that offers them says
 * "typical values, check your data sheet", and the modeller overwrites them with their own.
 */
import type { MaterialDataSheetInput } from './schemas.js';

export type MaterialKind = 'two-part-epoxy' | 'single-part-medium' | 'water-gel';

export interface MaterialPreset {
  readonly id: string;
  readonly name: string;
  readonly kind: MaterialKind;
  readonly dataSheet: MaterialDataSheetInput;
}

const HOUR = 60;

export const MATERIAL_PRESETS: readonly MaterialPreset[] = [
  {
    id: 'deep-pour-epoxy',
    name: 'Deep-pour casting epoxy, 2:1 by volume',
    kind: 'two-part-epoxy',
    dataSheet: {
      mixRatio: { basis: 'volume', partA: 2, partB: 1 },
      densityAGPerMl: 1.12,
      densityBGPerMl: 0.98,
      potLifeMin: 3 * HOUR,
      recoatMin: 24 * HOUR,
      recoatMaxMin: 72 * HOUR,
      demouldMin: 72 * HOUR,
      fullCureMin: 7 * 24 * HOUR,
      referenceTempC: 25,
      minCureTempC: 18,
      maxLayerMm: 50,
    },
  },
  {
    id: 'coating-epoxy',
    name: 'Coating epoxy, 1:1 by volume',
    kind: 'two-part-epoxy',
    dataSheet: {
      mixRatio: { basis: 'volume', partA: 1, partB: 1 },
      densityAGPerMl: 1.15,
      densityBGPerMl: 0.97,
      potLifeMin: 40,
      recoatMin: 5 * HOUR,
      recoatMaxMin: 24 * HOUR,
      demouldMin: 24 * HOUR,
      fullCureMin: 72 * HOUR,
      referenceTempC: 25,
      minCureTempC: 18,
      maxLayerMm: 6,
    },
  },
  {
    id: 'casting-epoxy-by-weight',
    name: 'Casting epoxy, 100:45 by weight',
    kind: 'two-part-epoxy',
    dataSheet: {
      mixRatio: { basis: 'weight', partA: 100, partB: 45 },
      densityAGPerMl: 1.16,
      densityBGPerMl: 0.96,
      potLifeMin: 45,
      recoatMin: 8 * HOUR,
      recoatMaxMin: 24 * HOUR,
      demouldMin: 24 * HOUR,
      fullCureMin: 7 * 24 * HOUR,
      referenceTempC: 23,
      minCureTempC: 18,
      maxLayerMm: 12,
    },
  },
  {
    id: 'acrylic-gloss-medium',
    name: 'Acrylic gloss medium (single part)',
    kind: 'single-part-medium',
    dataSheet: {
      mixRatio: { basis: 'volume', partA: 1 },
      densityAGPerMl: 1.06,
      potLifeMin: 15,
      recoatMin: 2 * HOUR,
      demouldMin: 24 * HOUR,
      fullCureMin: 72 * HOUR,
      referenceTempC: 21,
      minCureTempC: 10,
      maxLayerMm: 3,
    },
  },
  {
    id: 'water-effect-gel',
    name: 'Water-effect gel (single part)',
    kind: 'water-gel',
    dataSheet: {
      mixRatio: { basis: 'volume', partA: 1 },
      densityAGPerMl: 1.05,
      potLifeMin: 20,
      recoatMin: 24 * HOUR,
      demouldMin: 24 * HOUR,
      fullCureMin: 72 * HOUR,
      referenceTempC: 21,
      minCureTempC: 12,
      maxLayerMm: 3,
    },
  },
];

export function findMaterialPreset(id: string): MaterialPreset | undefined {
  return MATERIAL_PRESETS.find((preset) => preset.id === id);
}
