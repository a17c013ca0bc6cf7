/**
 * The usual cautions for the bench's materials: pouring water effects beside every plan, and cutting
 * foam, sanding plaster, spraying paint and gluing on the shelf. They are common practice, not a
 * substitute for the maker's safety data sheet or local rules.
 */
import type { MaterialKindName } from './domain-schemas.js';

export interface SafetyCaution {
  readonly id: string;
  readonly text: string;
}

const TWO_PART: readonly SafetyCaution[] = [
  { id: 'gloves', text: 'Wear nitrile gloves and eye protection: resin and hardener can sensitise skin for life.' },
  { id: 'air', text: 'Keep fresh air moving through the room while you mix, pour and cure.' },
  {
    id: 'layer',
    text: 'Never pour thicker than the maximum layer: a thick pour can overheat, crack, smoke or yellow.',
  },
  { id: 'batch', text: 'Mix only what you can pour within the pot life: a large mass in the cup heats up fastest.' },
  { id: 'foam', text: 'Seal foam before pouring: curing heat and solvents melt extruded polystyrene.' },
  { id: 'waste', text: 'Let leftovers cure in the cup before disposal; follow local rules for uncured resin.' },
];

const WATER_BASED: readonly SafetyCaution[] = [
  { id: 'gloves', text: 'Wear gloves and keep the medium away from eyes; wash skin with soap and water.' },
  { id: 'air', text: 'Work in a ventilated room while it dries.' },
  { id: 'layer', text: 'Build up in thin layers: thick layers stay cloudy and soft for days.' },
  { id: 'seal', text: 'Seal plaster, card and bare wood first so they do not draw the medium in and bubble.' },
];

export const DEFERENCE_NOTE = "The maker's safety data sheet and your local rules come first.";

const FOAM: readonly SafetyCaution[] = [
  {
    id: 'hot-wire',
    text: 'Cut foam with a hot wire only with fresh air moving and the wire no hotter than it needs: overheated polystyrene gives off harmful fumes.',
  },
  { id: 'blade', text: 'Cut away from your hand with a sharp blade; a blunt one slips.' },
];

const PLASTER: readonly SafetyCaution[] = [
  { id: 'dust', text: 'Mix and sand plaster and fillers with a dust mask; keep the dust away from eyes.' },
  { id: 'heat', text: 'Setting plaster warms up: never set a hand or body part in it.' },
];

const PAINTS: readonly SafetyCaution[] = [
  {
    id: 'air',
    text: 'Spray and airbrush only with fresh air moving and a mask for fine mist; solvent paints need more.',
  },
  { id: 'flame', text: 'Keep solvent paints and thinners away from flames and heat.' },
];

const ADHESIVES: readonly SafetyCaution[] = [
  { id: 'bond', text: 'Superglue bonds skin in seconds: keep debonder to hand and the nozzle away from eyes.' },
  { id: 'air', text: 'Work with fresh air moving: glue and solvent cement fumes irritate eyes and lungs.' },
];

const CAUTIONS: Readonly<Record<MaterialKindName, readonly SafetyCaution[]>> = {
  'two-part-epoxy': TWO_PART,
  'single-part-medium': WATER_BASED,
  'water-gel': WATER_BASED,
  'foam-and-boards': FOAM,
  'plaster-and-fillers': PLASTER,
  'paints-and-washes': PAINTS,
  adhesives: ADHESIVES,
  // What carries no usual hazard: scatter, figures, track.
  scenic: [],
  'kits-figures-details': [],
  track: [],
  other: [],
};

/** The cautions for a kind of material; none for what carries no usual hazard. */
export function safetyCautions(kind: MaterialKindName): readonly SafetyCaution[] {
  return CAUTIONS[kind];
}
