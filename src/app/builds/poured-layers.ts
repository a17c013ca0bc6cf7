import {
  formatWeighed,
  formatLength,
  formatStock,
  formatTemperature,
  type DisplayUnits,
  type FollowedPour,
  type StockUnit,
} from '@benchtide/shared';
import { format } from 'date-fns';
import { followLocalPour } from '../pours/followed-pour';
import type { LocalPour, LocalPourLayer } from '../sync/synced-records';
import type { MoneySum, PourDraw } from './build-log';
import { moneyText } from './build-words';
import type { PourRecord } from './pour-recipe';

const WHEN = 'EEE d MMM yyyy, HH:mm';
const MINUTE_MS = 60_000;

/** One layer of a pour as the log shows it: as really poured, or as it is now expected. */
export interface LayerLine {
  readonly number: number;
  readonly poured: boolean;
  /** The layer's record, once poured. */
  readonly record: LocalPourLayer | null;
  readonly atMs: number;
  readonly at: string;
  /** The plan made at Start, only where the real (or expected) time differs from it by a minute or more. */
  readonly plannedAt: string | null;
  readonly room: string;
  /** "2 mm: part A 5 g, part B 5 g". */
  readonly planned: string;
  /** What was really weighed, where recorded. */
  readonly weighed: string | null;
  readonly note: string;
}

/** Demould or full cure: counted from the last layer poured, or projected while layers are still to come. */
export interface PourMoment {
  readonly label: string;
  readonly at: string;
  readonly plannedAt: string | null;
  readonly projected: boolean;
}

export interface PouredLayers {
  readonly pourId: string;
  readonly followed: FollowedPour;
  readonly layerCount: number;
  readonly pouredCount: number;
  readonly lines: readonly LayerLine[];
  readonly moments: readonly PourMoment[];
  /** "2 of 3 layers poured". */
  readonly progress: string;
}

/** A pour as really poured, in the modeller's units; null while its plan has not come from the server. */
export function pouredLayers(
  pour: PourRecord,
  layers: readonly LocalPourLayer[],
  units: DisplayUnits,
  nowMs: number,
): PouredLayers | null {
  if (pour.plan === null || pour.request === null) return null;
  const followed = followLocalPour(pour as LocalPour, layers, nowMs);
  const mass = (g: number) => formatWeighed(g, pour.request!.scaleResolutionG, units.mass);
  const singlePart = pour.plan.mix.singlePart;
  const parts = (a: number, b: number) => (singlePart ? mass(a) : `part A ${mass(a)}, part B ${mass(b)}`);
  const byNumber = new Map(layers.map((layer) => [layer.number, layer]));
  const lines = followed.layers.map((layer): LayerLine => {
    const record = layer.poured ? (byNumber.get(layer.layer) ?? null) : null;
    return {
      number: layer.layer,
      poured: layer.poured,
      record,
      atMs: layer.pourAtMs,
      at: format(layer.pourAtMs, WHEN),
      plannedAt: differs(layer.pourAtMs, layer.plannedAtMs),
      room: formatTemperature(layer.roomTempC, units.temperature),
      planned: `${formatLength(layer.planned.depthMm, units.length)}: ${parts(layer.planned.partAG, layer.planned.partBG)}`,
      weighed: layer.weighed ? parts(layer.weighed.partAG, layer.weighed.partBG) : null,
      note: record?.note ?? '',
    };
  });
  const projected = followed.pouredCount < followed.layerCount;
  const moment = (label: string, atMs: number, plannedAtMs: number): PourMoment => ({
    label,
    at: format(atMs, WHEN),
    plannedAt: differs(atMs, plannedAtMs),
    projected,
  });
  return {
    pourId: pour.id,
    followed,
    layerCount: followed.layerCount,
    pouredCount: followed.pouredCount,
    lines,
    moments: [
      moment('Demould or handle', followed.demouldAtMs, followed.plannedDemouldAtMs),
      moment('Full cure', followed.fullCureAtMs, followed.plannedFullCureAtMs),
    ],
    progress: `${followed.pouredCount} of ${followed.layerCount} ${followed.layerCount === 1 ? 'layer' : 'layers'} poured`,
  };
}

function differs(atMs: number, plannedAtMs: number | undefined): string | null {
  return plannedAtMs === undefined || Math.abs(atMs - plannedAtMs) < MINUTE_MS ? null : format(plannedAtMs, WHEN);
}

/**
 * What deleting a pour gives back, in plain words: the stock it drew, named per part, returns to the shelf;
 * its cost leaves the build; its reminders are cancelled.
 */
export function deletionWords(draw: PourDraw | undefined, units: DisplayUnits, locale: string): string[] {
  const drawn = (draw?.drawn ?? []).filter((line) => line.quantity > 0);
  const amount = (quantity: number, unit: StockUnit) => formatStock(quantity, unit, units.mass !== 'g');
  const stock =
    drawn.length === 0
      ? 'It drew nothing from the shelf, so no stock goes back.'
      : `The stock it drew goes back to the shelf: ${drawn
          .map(
            (line) => `${line.part === 'single' ? 'medium' : `part ${line.part}`} ${amount(line.quantity, line.unit)}`,
          )
          .join(', ')}.`;
  const costs = (draw?.costs ?? []).filter((sum: MoneySum) => sum.minor !== 0);
  const cost =
    costs.length === 0
      ? 'It was not costed, so the build’s cost stays as it is.'
      : `Its cost, ${costs.map((sum) => moneyText(sum.minor, sum.currency, locale)).join(' + ')}, leaves the build’s cost.`;
  return [stock, cost, 'Its reminders are cancelled, and its layers leave the log.'];
}
