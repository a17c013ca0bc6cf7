import {
  effectiveUseBy,
  formatNumber,
  MATERIAL_KIND_WORDS,
  MEASURE_WORDS,
  unitLabel,
  shelfWarnings,
  type ContainerPart,
  type MaterialDataSheet,
  type ShelfWarningKind,
} from '@benchtide/shared';
import { format } from 'date-fns';
import type { LocalContainer, LocalMaterial } from '../sync/synced-records';

/** A container with what its stock book on this device says is left. */
export interface ContainerStock {
  readonly container: LocalContainer;
  readonly remainingQty: number;
}

/** A material with its live containers, oldest first. */
export interface MaterialStock {
  readonly material: LocalMaterial;
  readonly containers: readonly ContainerStock[];
}

/** A container as the shelf's table shows it: every text worked out once, for the cells, sorting and the filter. */
export interface ContainerRow {
  readonly id: string;
  readonly container: LocalContainer;
  readonly partLabel: string;
  readonly boughtOn: string;
  readonly boughtOnText: string;
  readonly lot: string;
  readonly remainingQty: number;
  /** 0 to 100, to a tenth, for the bar. */
  readonly percentLeft: number;
  /** "320 of 500 g" */
  readonly amountText: string;
  /** "low" or "empty", beside the amount; null when neither. */
  readonly stockWord: 'low' | 'empty' | null;
  readonly openedText: string;
  /** The earlier of the printed use-by day and the opened day plus the shelf life once opened. */
  readonly useBy: string | null;
  readonly useByText: string;
  /** "past use-by", or "use by 16 Dec" when near; null when neither. */
  readonly useByWord: string | null;
  readonly pricePerUnit: number;
  /** "€0.08 / g" */
  readonly pricePerUnitText: string;
  /** Lower-case words the filter looks through. */
  readonly filterText: string;
}

export const KIND_LABELS: Readonly<Record<LocalMaterial['kind'], string>> = MATERIAL_KIND_WORDS;

export const PART_LABELS: Readonly<Record<ContainerPart, string>> = {
  A: 'Part A',
  B: 'Part B',
  single: 'Single part',
};

/** Bench scales read to 0.1 g at best; hundredths only show on small amounts. */
export function quantityText(quantity: number): string {
  return formatNumber(quantity, { significant: 4, maxDecimals: 2 });
}

/** "320 of 500 g" */
function amountText(remainingQty: number, container: Pick<LocalContainer, 'sizeQty' | 'unit'>): string {
  return `${quantityText(remainingQty)} of ${quantityText(container.sizeQty)} ${unitLabel(container.unit)}`;
}

export function dayText(day: string): string {
  return format(`${day}T00:00:00`, 'd MMM yyyy');
}

/** Price ÷ size in the currency; a fraction of a cent stays visible, since a gram of resin often costs one. */
export function pricePerUnitText(container: Pick<LocalContainer, 'priceMinor' | 'currency' | 'sizeQty' | 'unit'>) {
  const perUnit = container.priceMinor / 100 / container.sizeQty;
  const digits = perUnit >= 1 ? {} : { minimumFractionDigits: 2, maximumFractionDigits: 4 };
  const money = new Intl.NumberFormat(undefined, { style: 'currency', currency: container.currency, ...digits });
  return `${money.format(perUnit)} / ${unitLabel(container.unit)}`;
}

/** Today on this device, as YYYY-MM-DD. */
export function localDay(atMs = Date.now()): string {
  return format(atMs, 'yyyy-MM-dd');
}

/** The rows of a material's containers, with the shelf's warnings as of `today` (YYYY-MM-DD). */
export function containerRows(stock: MaterialStock, today: string): ContainerRow[] {
  const { material } = stock;
  const remaining = Object.fromEntries(stock.containers.map((entry) => [entry.container.id, entry.remainingQty]));
  const warnings = shelfWarnings(
    stock.containers.map((entry) => entry.container),
    remaining,
    today,
    () => material.shelfLifeOpenedDays,
  );
  return stock.containers.map(({ container, remainingQty }) => {
    const kinds = new Set<ShelfWarningKind>(
      warnings.filter((warning) => warning.containerId === container.id).map((warning) => warning.kind),
    );
    const useBy = effectiveUseBy(container, material.shelfLifeOpenedDays);
    const stockWord = kinds.has('empty') || remainingQty <= 0 ? 'empty' : kinds.has('low') ? 'low' : null;
    const useByWord = kinds.has('expired')
      ? 'past use-by'
      : kinds.has('expiring') && useBy !== null
        ? `use by ${format(`${useBy}T00:00:00`, 'd MMM')}`
        : null;
    const row = {
      id: container.id,
      container,
      // Parts belong to what is poured; anything else is simply a pack on the shelf.
      partLabel: material.dataSheet ? PART_LABELS[container.part] : 'Pack',
      boughtOn: container.boughtOn,
      boughtOnText: dayText(container.boughtOn),
      lot: container.lot ?? '',
      remainingQty,
      percentLeft: Math.min(100, Math.max(0, Math.round((remainingQty / container.sizeQty) * 1000) / 10)),
      amountText: amountText(remainingQty, container),
      stockWord,
      openedText: container.openedOn ? `Opened ${dayText(container.openedOn)}` : 'Not opened',
      useBy,
      useByText: useBy === null ? 'No use-by date' : `Use by ${dayText(useBy)}`,
      useByWord,
      pricePerUnit: container.priceMinor / container.sizeQty,
      pricePerUnitText: pricePerUnitText(container),
    } satisfies Omit<ContainerRow, 'filterText'>;
    const words = [row.partLabel, row.boughtOnText, row.lot, row.amountText, stockWord, row.openedText, row.useByText];
    return { ...row, filterText: [...words, useByWord].filter(Boolean).join(' ').toLowerCase() };
  });
}

/** What a material pours like (its data sheet's mix), or how it is measured when it is not poured. */
export function measureLine(material: Pick<LocalMaterial, 'dataSheet' | 'measure'>): string {
  if (material.dataSheet) return mixLine(material.dataSheet);
  return material.measure ? MEASURE_WORDS[material.measure] : '';
}

/** The material's data sheet in a line, so a row of the shelf says what it pours like. */
export function mixLine(sheet: MaterialDataSheet): string {
  const { basis, partA, partB } = sheet.mixRatio;
  return partB ? `${formatNumber(partA)} : ${formatNumber(partB)} by ${basis}` : 'single part';
}
