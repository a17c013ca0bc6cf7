import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer, type EnvironmentProviders, type Provider } from '@angular/core';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Role, SessionView } from '@benchtide/shared';
import { of } from 'rxjs';
import { v7 } from 'uuid';
import { BenchIcons } from '../core/bench-icons';
import { BENCH_DB_NAME, type BenchDb } from '../sync/bench-db';
import { nextTask } from '../sync/sync-testing';
import type { LocalLedgerEntry } from '../sync/synced-records';

/**
 * For the Shelf specs: a signed-in modeller in one invented workshop and a fresh IndexedDB per spec. The
 * screen itself only reads and writes through the device store.
 */
export const WORKSHOP_ID = v7();
const SESSION_KEY = 'benchtide.session';

/** `role` null: signed in but in no workshop; 'signed-out': no account on this device. */
export function signIn(role: Role | null | 'signed-out'): void {
  localStorage.clear();
  if (role === 'signed-out') return;
  const session: SessionView = {
    account: { id: 'u-bea', email: 'bea@example.org', displayName: 'Bea Stirling', emailVerified: true },
    workshops:
      role === null ? [] : [{ id: WORKSHOP_ID, name: 'Tideway Bench Club', personal: false, role, memberCount: 3 }],
  };
  localStorage.setItem(SESSION_KEY, JSON.stringify(session));
}

/** Makes the page lay out as on a phone (or not), whatever the test browser's width. */
export function screenIsPhone(phone: boolean): Provider {
  const state: BreakpointState = { matches: phone, breakpoints: {} };
  return {
    provide: BreakpointObserver,
    useValue: { observe: () => of(state), isMatched: () => phone } satisfies Partial<BreakpointObserver>,
  };
}

export function shelfTestProviders(specName: string): (Provider | EnvironmentProviders)[] {
  return [
    { provide: BENCH_DB_NAME, useValue: `${specName}-${v7()}` },
    { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
    provideRouter([]),
    provideHttpClient(),
    provideHttpClientTesting(),
    provideAppInitializer(() => inject(BenchIcons).register()),
  ];
}

/** A pour's draw from a container, as the server sends it back after the pour syncs. */
export async function putPourUse(db: BenchDb, containerId: string, quantity: number): Promise<void> {
  const at = '2025-03-02T09:00:00.000Z';
  const entry: LocalLedgerEntry = {
    id: v7(),
    workshopId: WORKSHOP_ID,
    createdAt: at,
    updatedAt: at,
    deletedAt: null,
    changeNumber: 7,
    containerId,
    kind: 'pour-use',
    quantity,
    costMinor: 0,
    at,
    pourId: v7(),
    note: '',
  };
  await db.ledgerEntries.put(entry);
}

/** Waits until an IndexedDB read gives what is expected; fails after 3 s. */
export async function eventually<T>(read: () => Promise<T>, ok: (value: T) => boolean, what: string): Promise<T> {
  const giveUpAt = performance.now() + 3_000;
  for (;;) {
    const value = await read();
    if (ok(value)) return value;
    if (performance.now() > giveUpAt) throw new Error(`Gave up waiting for ${what}`);
    await nextTask();
  }
}
