/**
 * The usual cautions for pouring water effects, shown beside every plan. They are common
 * practice, not a substitute for the maker's safety data sheet or local rules.
 */
import type { MaterialKind } from './material-presets.js';

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

export function safetyCautions(kind: MaterialKind): readonly SafetyCaution[] {
  return kind === 'two-part-epoxy' ? TWO_PART : WATER_BASED;
}
