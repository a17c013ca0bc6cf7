import { computed, inject, Injectable, signal, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup } from '@angular/forms';
import {
  displayUnitsFor,
  drawForPour,
  formatMoney,
  fromCelsius,
  planPour,
  sumCostsMinor,
  toCelsius,
  toMl,
  toMm,
  wholeMinor,
  type DisplayUnits,
  type NewPour,
  type PourPlanRequestInput,
} from '@benchtide/shared';
import { map, startWith, timer } from 'rxjs';
import { DevicePreferences } from '../core/device-preferences';
import { parseDecimal } from '../core/decimal-input';
import { featureControls, fewestLayers, fieldText, layerCountFrom, shapeFrom, text } from './pour-form';
import { PourLog } from './pour-log';

/** A room in a house, when nothing better is known (common practice). */
const USUAL_ROOM_C = 20;
export const LAST_BUILD_KEY = 'benchtide.last-pour-build';

function number(value: string): number {
  return parseDecimal(value) ?? Number.NaN;
}

/** What "Start pour" sends, or why it cannot be sent yet, in plain words. */
export type PourToLog = { readonly pour: Omit<NewPour, 'id'> } | { readonly problem: string };

/**
 * The pour being logged, in one place: what is typed, the units, the build, material and containers
 * chosen, and what follows from them (the plan, the stock it draws, its cost and the request "Start
 * pour" sends). Until the modeller chooses, the build is the one linked or last poured into, the
 * material the last pour's, the room the last pour's: those are read from here, never written into
 * the form, so a choice the modeller made is never overwritten.
 */
@Injectable()
export class PourDraft {
  private readonly pourLog = inject(PourLog);
  private readonly preferences = inject(DevicePreferences);

  readonly form = new FormGroup({
    note: text(),
    ...featureControls(),
    /** Empty: the pour starts when "Start pour" is pressed. */
    startAt: text(),
    containerIds: new FormControl<string[]>([], { nonNullable: true }),
    recordShortfall: new FormControl(false, { nonNullable: true }),
    /** Empty: the fewest layers the material's maximum layer allows. */
    layerCount: text(),
  });

  readonly builds = this.pourLog.builds();
  readonly materials = this.pourLog.materials();
  readonly lastPour = this.pourLog.lastPour();

  private readonly linkedBuild = signal<Signal<string | undefined>>(signal(undefined));
  private readonly chosenBuild = signal<string | null>(null);
  private readonly chosenMaterial = signal<string | null>(null);
  private readonly typedRoom = signal<string | null>(null);
  private readonly layersTyped = signal(false);

  readonly value = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  /** Minutes tick, so "start now" plans stay current while the modeller stirs. */
  private readonly minute = toSignal(timer(0, 60_000).pipe(map(() => Date.now())), { initialValue: Date.now() });

  readonly units = computed<DisplayUnits>(() => {
    const { unitSystem, temperatureUnit } = this.preferences.values();
    return { ...displayUnitsFor(unitSystem), temperature: temperatureUnit };
  });

  /** The build chosen, or the one linked, or the one last poured into on this device, or the latest. */
  readonly buildId = computed(() => {
    const builds = this.builds();
    const wanted = this.chosenBuild() ?? this.linkedBuild()() ?? stored(LAST_BUILD_KEY);
    return builds.find((b) => b.id === wanted)?.id ?? builds[0]?.id ?? '';
  });
  /** The material chosen, or the last pour's, or the first on the shelf. */
  readonly materialId = computed(() => {
    const materials = this.materials();
    const wanted = this.chosenMaterial() ?? this.lastPour()?.materialId;
    return materials.find((m) => m.id === wanted)?.id ?? materials[0]?.id ?? '';
  });
  /** The room temperature as typed, or the last pour's, or a usual room's, in the display unit. */
  readonly roomTemp = computed(
    () =>
      this.typedRoom() ??
      fieldText(fromCelsius(this.lastPour()?.request.roomTempC ?? USUAL_ROOM_C, this.units().temperature)),
  );

  readonly roomTyped = computed(() => this.typedRoom() !== null);

  readonly material = computed(() => this.materials().find((m) => m.id === this.materialId()) ?? null);
  readonly stock = this.pourLog.stockOf(computed(() => this.materialId() || null));
  readonly startAtMs = computed(() => {
    const typed = this.value().startAt;
    return typed === '' ? this.minute() : new Date(typed).getTime();
  });

  readonly request = computed<PourPlanRequestInput | null>(() => {
    const material = this.material();
    if (material === null) return null;
    const value = this.value();
    const units = this.units();
    return {
      shape: shapeFrom(value, units),
      depthMm: toMm(number(value.depth), units.length),
      displacedMl: toMl(number(value.displaced || '0'), units.volume),
      wastePercent: number(value.wastePercent || '0'),
      material: material.dataSheet,
      roomTempC: toCelsius(number(this.roomTemp()), units.temperature),
      startAtMs: this.startAtMs(),
      scaleResolutionG: this.preferences.values().scaleResolutionG,
      cupResolutionMl: this.preferences.values().cupResolutionMl,
      ...layerCountFrom(value.layerCount),
    };
  });
  /** The fewest layers the depth takes at the material's maximum layer, and the hint saying so. */
  readonly fewest = computed(() => {
    const request = this.request();
    return request === null ? null : fewestLayers(request.depthMm, request.material.maxLayerMm, this.units());
  });
  /** What the Layers field shows: the fewest until the modeller types there (emptied, it plans the fewest). */
  readonly layersShown = computed(() => {
    const typed = this.value().layerCount;
    return typed !== '' || this.layersTyped() ? typed : String(this.fewest()?.count ?? '');
  });
  readonly layersChosen = computed(() => this.layersTyped() && this.value().layerCount.trim() !== '');
  readonly result = computed(() => {
    const request = this.request();
    return request === null ? null : planPour(request);
  });
  readonly draw = computed(() => {
    const result = this.result();
    if (result === null || !result.ok) return null;
    const chosen = this.value().containerIds;
    return drawForPour(result.plan, this.stock(), chosen.length > 0 ? chosen : undefined);
  });
  readonly cost = computed(() => {
    const draw = this.draw();
    const currency = this.stock()[0]?.currency;
    if (draw === null || currency === undefined) return null;
    return formatMoney(wholeMinor(sumCostsMinor(draw.uses.map((use) => use.costMinor))), currency);
  });

  /** The request "Start pour" sends, built once from the draft. */
  readonly toLog = computed<PourToLog>(() => {
    const value = this.value();
    const request = this.request();
    const result = this.result();
    if (this.buildId() === '') return { problem: 'Choose the build this pour is for.' };
    if (request === null) return { problem: 'Choose a material from the shelf.' };
    if (result === null || !result.ok) {
      return { problem: 'Some values need another look: see the notes beside the fields.' };
    }
    const draw = this.draw();
    if (draw && draw.shortfall.length > 0 && !value.recordShortfall) {
      return {
        problem:
          'The shelf does not hold enough for this pour. Add a container on the Shelf, or tick that the rest comes from a bottle not on the shelf.',
      };
    }
    return {
      pour: {
        buildId: this.buildId(),
        materialId: this.materialId(),
        shape: request.shape,
        depthMm: request.depthMm,
        displacedMl: request.displacedMl ?? 0,
        wastePercent: request.wastePercent ?? 0,
        roomTempC: request.roomTempC,
        startAt: new Date(this.startAtMs()).toISOString(),
        scaleResolutionG: request.scaleResolutionG ?? 0.1,
        cupResolutionMl: request.cupResolutionMl ?? 1,
        ...(value.containerIds.length > 0 ? { containerIds: value.containerIds } : {}),
        whenShort: value.recordShortfall ? 'record-shortfall' : 'refuse',
        note: value.note,
        ...(request.layerCount === undefined ? {} : { layerCount: request.layerCount }),
      },
    };
  });

  /** The build a link (`?build=`) names, until the modeller chooses another. */
  followLink(build: Signal<string | undefined>): void {
    this.linkedBuild.set(build);
  }

  chooseBuild(id: string): void {
    this.chosenBuild.set(id);
  }

  chooseMaterial(id: string): void {
    this.chosenMaterial.set(id);
  }

  typeRoom(text: string): void {
    this.typedRoom.set(text);
  }

  /** Empty plans the fewest layers; a number more than that plans thinner layers. */
  typeLayers(text: string): void {
    this.layersTyped.set(true);
    this.form.controls.layerCount.setValue(text);
  }

  /** A repeated pour's layers: the number it chose, or the fewest again when it chose none. */
  repeatLayers(layerCount: number | undefined): void {
    this.layersTyped.set(layerCount !== undefined);
    this.form.controls.layerCount.setValue(layerCount === undefined ? '' : String(layerCount));
  }

  /** Remembers the build poured into, for the next pour on this device. */
  remember(buildId: string): void {
    try {
      localStorage.setItem(LAST_BUILD_KEY, buildId);
    } catch {
      // Private browsing: the next pour just starts from the latest build.
    }
  }
}

function stored(key: string): string | null {
  try {
    return localStorage.getItem(key);
  } catch {
    return null;
  }
}
