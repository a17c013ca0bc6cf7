import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import {
  ChangeDetectionStrategy,
  Component,
  inject,
  provideAppInitializer,
  type EnvironmentProviders,
  type Provider,
} from '@angular/core';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { firstLayer, planPour, type MaterialDataSheet, type Role, type SessionView } from '@benchtide/shared';
import { v7 } from 'uuid';
import { BenchIcons } from '../core/bench-icons';
import { BENCH_DB_NAME, type BenchDb } from '../sync/bench-db';
import type { LocalContainer, LocalLedgerEntry, LocalMaterial, SyncedFields } from '../sync/synced-records';
import type { PourRecord } from './pour-recipe';

/**
 * For the Builds specs: a signed-in modeller in one workshop, a fresh IndexedDB per spec, and records as
 * the server would have sent them. The screens themselves only ever read and write through the device store.
 */
export const WORKSHOP_ID = v7();
export const WORKSHOP_NAME = 'River Club';
const SESSION_KEY = 'benchtide.session';

@Component({ template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Elsewhere {}

/** `role` null: signed in but in no workshop; 'signed-out': no account on this device. */
export function signIn(role: Role | null | 'signed-out'): void {
  localStorage.clear();
  if (role === 'signed-out') return;
  const session: SessionView = {
    account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
    workshops: role === null ? [] : [{ id: WORKSHOP_ID, name: WORKSHOP_NAME, personal: false, role, memberCount: 2 }],
  };
  localStorage.setItem(SESSION_KEY, JSON.stringify(session));
}

export function buildsTestProviders(specName: string): (Provider | EnvironmentProviders)[] {
  return [
    { provide: BENCH_DB_NAME, useValue: `${specName}-${v7()}` },
    provideRouter(
      [
        { path: 'builds', component: Elsewhere },
        { path: 'builds/:buildId', component: Elsewhere },
        { path: 'log-pour', component: Elsewhere },
      ],
      withComponentInputBinding(),
    ),
    provideHttpClient(),
    provideHttpClientTesting(),
    provideAppInitializer(() => inject(BenchIcons).register()),
  ];
}

function synced(createdAt = '2025-03-01T09:00:00.000Z'): Omit<SyncedFields, 'id'> {
  return { workshopId: WORKSHOP_ID, createdAt, updatedAt: createdAt, deletedAt: null, changeNumber: 1 };
}

/**
 * 1 : 1 by volume, both parts 1 g/mL, at most 2 mm a layer, times given at 20 °C. Made-up round numbers
 * so the amounts can be worked by hand: they are no maker's figures.
 */
export const ROUND_SHEET: MaterialDataSheet = {
  mixRatio: { basis: 'volume', partA: 1, partB: 1 },
  densityAGPerMl: 1,
  densityBGPerMl: 1,
  potLifeMin: 30,
  recoatMin: 240,
  demouldMin: 720,
  fullCureMin: 1440,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 2,
};

export async function putMaterial(db: BenchDb, name: string, kind: LocalMaterial['kind'] = 'two-part-epoxy') {
  const material: LocalMaterial = {
    id: v7(),
    ...synced(),
    name,
    kind,
    dataSheet: ROUND_SHEET,
    measure: null,
    shelfLifeOpenedDays: null,
    safetySheet: 'Maker’s sheet in the blue folder',
  };
  await db.materials.put(material);
  return material;
}

export async function putContainer(db: BenchDb, materialId: string, currency: string) {
  const container: LocalContainer = {
    id: v7(),
    ...synced(),
    materialId,
    part: 'A',
    sizeQty: 500,
    unit: 'g',
    priceMinor: 4000,
    currency,
    boughtOn: '2025-02-01',
    openedOn: null,
    useBy: null,
    lowStockQty: null,
    lot: null,
  };
  await db.containers.put(container);
  return container;
}

/**
 * A pour of a 100 × 50 mm rectangle, 4 mm deep, planned as the server plans it: 20 mL in two layers of
 * 2 mm, 5 mL (5 g) of each part per layer, 20 g in all.
 */
export async function putPour(db: BenchDb, buildId: string, materialId: string, startAt: string, planned = true) {
  const result = planPour({
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
    depthMm: 4,
    material: ROUND_SHEET,
    roomTempC: 20,
    startAtMs: Date.parse(startAt),
    scaleResolutionG: 0.1,
  });
  if (!result.ok) throw new Error('The round pour must plan');
  const { request, ...plan } = result.plan;
  const pour: PourRecord = {
    id: v7(),
    ...synced(startAt),
    buildId,
    stepId: null,
    materialId,
    startAt,
    request: planned ? request : null,
    plan: planned ? plan : null,
    shortfall: [],
    note: '',
    layerCount: plan.layers.count,
  };
  await db.pours.put(pour as never);
  // Layer 1 goes on with its pour and shares its id, as the store writes it.
  await db.pourLayers.put({ id: pour.id, ...synced(startAt), pourId: pour.id, ...firstLayer(plan, startAt, 20) });
  return pour;
}

export async function putPourUse(db: BenchDb, containerId: string, pourId: string, costMinor: number) {
  const entry: LocalLedgerEntry = {
    id: v7(),
    ...synced(),
    containerId,
    kind: 'pour-use',
    quantity: -10,
    costMinor,
    at: '2025-03-02T09:00:00.000Z',
    pourId,
    note: '',
  };
  await db.ledgerEntries.put(entry);
  return entry;
}
