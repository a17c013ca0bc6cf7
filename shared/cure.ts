/**
 * Cure schedule from the maker's data sheet, corrected for the room. Always an estimate:
 * resin cures by its own chemistry, humidity, mass and the mould, not by our arithmetic.
 */
import type { TradeWarning } from './warning.js';

export interface CureDataSheet {
  readonly potLifeMin: number;
  /** Earliest time the next layer may go on. */
  readonly recoatMin: number;
  /** End of the recoat window, if the data sheet gives one (later layers need sanding). */
  readonly recoatMaxMin?: number;
  readonly demouldMin: number;
  readonly fullCureMin: number;
  /** Temperature the data-sheet times are given at. */
  readonly referenceTempC: number;
  readonly minCureTempC: number;
  readonly maxLayerMm: number;
}

/** Common practice: above this, pot life shortens sharply and a thick mix can run away (exotherm). */
export const HOT_ROOM_TEMP_C = 30;

const MS_PER_MIN = 60_000;

export type CureWarningCode = 'below-minimum-temperature' | 'hot-room' | 'layer-too-thick';

/**
 * Rule of thumb (common practice; Arrhenius / van 't Hoff): every 10 degrees C warmer
 * roughly halves the time, t = t_ref x 2^((T_ref - T) / 10).
 */
export function correctForTemperature(minutesAtRef: number, refTempC: number, roomTempC: number): number {
  minutes(minutesAtRef, 'A data-sheet time');
  degrees(refTempC, "The data sheet's temperature");
  degrees(roomTempC, 'Room temperature');
  return minutesAtRef * 2 ** ((refTempC - roomTempC) / 10);
}

function minutes(value: number, label: string): number {
  if (!Number.isFinite(value) || value < 0) {
    throw new RangeError(`${label} must be a finite number of 0 minutes or more, got ${value}`);
  }
  return value;
}

function degrees(value: number, label: string): number {
  if (!Number.isFinite(value)) throw new RangeError(`${label} must be a finite number of degrees C, got ${value}`);
  return value;
}

function instant(ms: number, label: string): number {
  if (!Number.isFinite(ms)) throw new RangeError(`${label} must be epoch milliseconds, got ${ms}`);
  return ms;
}

export interface TemperatureCorrection {
  readonly roomTempC: number;
  /** The temperature the times are worked out at: the room, or the minimum cure temperature if colder. */
  readonly effectiveTempC: number;
  /** Multiply a data-sheet time by this. */
  readonly factor: number;
  /** False when the room is below the minimum cure temperature: the material may not cure at all. */
  readonly reliable: boolean;
  readonly warnings: readonly TradeWarning<CureWarningCode>[];
}

/**
 * Below the minimum cure temperature the rule of thumb no longer holds (the cure may stall),
 * so times are shown at the minimum temperature and flagged unreliable rather than stretched.
 */
export function temperatureCorrection(
  dataSheet: Pick<CureDataSheet, 'referenceTempC' | 'minCureTempC'>,
  roomTempC: number,
): TemperatureCorrection {
  degrees(roomTempC, 'Room temperature');
  degrees(dataSheet.minCureTempC, 'The minimum cure temperature');
  const tooCold = roomTempC < dataSheet.minCureTempC;
  const effectiveTempC = tooCold ? dataSheet.minCureTempC : roomTempC;
  const warnings: TradeWarning<CureWarningCode>[] = [];
  if (tooCold) {
    warnings.push({
      code: 'below-minimum-temperature',
      message:
        "The room is colder than this material's minimum cure temperature: it may stay soft, tacky or cloudy. " +
        'The times shown are for the minimum temperature and will be longer, if it cures at all. Warm the room before pouring.',
    });
  }
  if (roomTempC > HOT_ROOM_TEMP_C) {
    warnings.push({
      code: 'hot-room',
      message:
        'A hot room shortens pot life and raises the risk of the mix overheating (exotherm). Mix small batches and pour promptly.',
    });
  }
  return {
    roomTempC,
    effectiveTempC,
    factor: correctForTemperature(1, dataSheet.referenceTempC, effectiveTempC),
    reliable: !tooCold,
    warnings,
  };
}

export interface CureTimelineInput {
  readonly dataSheet: CureDataSheet;
  readonly roomTempC: number;
  /** Epoch milliseconds of the first pour. */
  readonly startAtMs: number;
  readonly layerCount: number;
  /** Planned depth of each layer, checked against the data sheet's maximum. */
  readonly layerDepthMm?: number;
}

export interface LayerTimes {
  /** 1 for the first layer. */
  readonly layer: number;
  readonly pourAtMs: number;
  readonly potLifeEndsAtMs: number;
  readonly recoatFromMs: number;
  readonly recoatUntilMs?: number;
}

export interface CorrectedTimes {
  readonly potLifeMin: number;
  readonly recoatMin: number;
  readonly recoatMaxMin?: number;
  readonly demouldMin: number;
  readonly fullCureMin: number;
}

export interface CureTimeline extends Omit<TemperatureCorrection, 'warnings'> {
  readonly isEstimate: true;
  readonly times: CorrectedTimes;
  /** Each layer goes on at the earliest recoat time of the one before. */
  readonly layers: readonly LayerTimes[];
  /** Demould and full cure count from the last layer's pour. */
  readonly demouldAtMs: number;
  readonly fullCureAtMs: number;
  readonly warnings: readonly TradeWarning<CureWarningCode>[];
}

/** A data sheet's times at one room temperature. */
export function correctedTimes(dataSheet: CureDataSheet, factor: number): CorrectedTimes {
  if (!Number.isFinite(factor) || factor <= 0) {
    throw new RangeError(`A temperature factor must be a finite number above 0, got ${factor}`);
  }
  const at = (value: number, label: string) => factor * minutes(value, label);
  return {
    potLifeMin: at(dataSheet.potLifeMin, 'Pot life'),
    recoatMin: at(dataSheet.recoatMin, 'Recoat time'),
    ...(dataSheet.recoatMaxMin === undefined
      ? {}
      : { recoatMaxMin: at(dataSheet.recoatMaxMin, 'The end of the recoat window') }),
    demouldMin: at(dataSheet.demouldMin, 'Demould time'),
    fullCureMin: at(dataSheet.fullCureMin, 'Full cure'),
  };
}

/** `minutes` after `fromMs`, to the millisecond. */
export const after = (fromMs: number, minutes: number) => fromMs + Math.round(minutes * MS_PER_MIN);

/** One layer's moments, counted from when it goes on at the times of its room. */
export function layerTimesAt(layer: number, pourAtMs: number, times: CorrectedTimes): LayerTimes {
  if (!Number.isInteger(layer) || layer < 1) throw new RangeError(`A layer is numbered from 1, got ${layer}`);
  instant(pourAtMs, 'When the layer went on');
  return {
    layer,
    pourAtMs,
    potLifeEndsAtMs: after(pourAtMs, times.potLifeMin),
    recoatFromMs: after(pourAtMs, times.recoatMin),
    ...(times.recoatMaxMin === undefined ? {} : { recoatUntilMs: after(pourAtMs, times.recoatMaxMin) }),
  };
}

export function cureTimeline(input: CureTimelineInput): CureTimeline {
  const { dataSheet, layerCount, startAtMs } = input;
  if (!Number.isInteger(layerCount) || layerCount < 1) {
    throw new RangeError(`Layer count must be a whole number of 1 or more, got ${layerCount}`);
  }
  instant(startAtMs, 'Start time');
  const correction = temperatureCorrection(dataSheet, input.roomTempC);
  const times = correctedTimes(dataSheet, correction.factor);
  const layers: LayerTimes[] = [];
  let pourAtMs = startAtMs;
  for (let layer = 1; layer <= layerCount; layer += 1) {
    const next = layerTimesAt(layer, pourAtMs, times);
    layers.push(next);
    pourAtMs = next.recoatFromMs;
  }
  const lastPourAtMs = layers[layers.length - 1]?.pourAtMs ?? startAtMs;

  const warnings = [...correction.warnings];
  // The tolerance keeps depth / count (e.g. 2.1 / 3 layers of 0.7) from tripping on binary residue.
  if (input.layerDepthMm !== undefined && input.layerDepthMm > dataSheet.maxLayerMm * (1 + 1e-9)) {
    warnings.push({
      code: 'layer-too-thick',
      message:
        'Each layer is thicker than the data sheet allows. A thick layer can overheat, crack, yellow or melt foam beneath it: pour more, thinner layers.',
    });
  }

  return {
    isEstimate: true,
    roomTempC: correction.roomTempC,
    effectiveTempC: correction.effectiveTempC,
    factor: correction.factor,
    reliable: correction.reliable,
    times,
    layers,
    demouldAtMs: after(lastPourAtMs, times.demouldMin),
    fullCureAtMs: after(lastPourAtMs, times.fullCureMin),
    warnings,
  };
}
