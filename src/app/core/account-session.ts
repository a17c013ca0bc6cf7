import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type { SessionView, SignInRequest, WorkshopView } from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';

const SESSION_KEY = 'benchtide.session';
const WORKSHOP_KEY = 'benchtide.current-workshop';

/**
 * Who is signed in on this device and which workshop they are working in. The server's last answer is kept
 * on the device, so a modeller who loses the connection stays signed in; it counts as stale until the server
 * confirms it again.
 */
@Injectable({ providedIn: 'root' })
export class AccountSession {
  private readonly http = inject(HttpClient);

  private readonly state = signal<SessionView | null>(storedSession());
  private readonly confirmed = signal(false);
  private readonly chosenWorkshopId = signal<string | null>(stored(WORKSHOP_KEY));
  /** The load in flight, for a guard to wait on. */
  private loading: Promise<void> | null = null;
  /** Counts changes made here, so that a slower answer to an older load cannot undo a newer sign-in. */
  private changes = 0;

  readonly session = this.state.asReadonly();
  readonly account = computed(() => this.state()?.account ?? null);
  readonly workshops = computed(() => this.state()?.workshops ?? []);
  readonly signedIn = computed(() => this.state() !== null);
  /** Signed in from what this device last knew, not yet confirmed by the server. */
  readonly stale = computed(() => this.state() !== null && !this.confirmed());
  readonly currentWorkshop = computed<WorkshopView | null>(() => {
    const workshops = this.workshops();
    return workshops.find((workshop) => workshop.id === this.chosenWorkshopId()) ?? workshops[0] ?? null;
  });
  readonly currentWorkshopId = computed(() => this.currentWorkshop()?.id ?? null);

  /** Asks the server who is signed in. Never fails: without a connection the last known session stays. */
  refresh(): Promise<void> {
    this.loading ??= this.load().finally(() => (this.loading = null));
    return this.loading;
  }

  /**
   * At start-up, asks only when this device remembers a session: a device that never signed in has
   * nothing to confirm, and needn't ask the server (and log a refusal) on every visit.
   */
  refreshIfRemembered(): Promise<void> {
    return this.state() === null ? Promise.resolve() : this.refresh();
  }

  /** Resolves once the load in flight, if any, has its answer. */
  settled(): Promise<void> {
    return this.loading ?? Promise.resolve();
  }

  async signIn(request: SignInRequest): Promise<void> {
    this.keep(await firstValueFrom(this.http.post<SessionView>('/api/auth/sign-in', request)));
  }

  async signOut(): Promise<void> {
    try {
      await firstValueFrom(this.http.post<void>('/api/auth/sign-out', null));
    } catch (error) {
      // Ended already (elsewhere, or by a password change): this device only has to forget it.
      if (!(error instanceof HttpErrorResponse && error.status === 401)) throw error;
    }
    this.forget();
  }

  async signOutOthers(): Promise<void> {
    await firstValueFrom(this.http.post<void>('/api/auth/sign-out-others', null));
  }

  /** Takes a session the server just sent. */
  keep(session: SessionView): void {
    this.changes += 1;
    this.confirmed.set(true);
    const kept = JSON.stringify(session);
    // The server confirming what the device already knew changes nothing on screen: a new object
    // here would make every screen that reads the account or workshop render again at start-up.
    if (kept === JSON.stringify(this.state())) return;
    this.state.set(session);
    store(SESSION_KEY, kept);
  }

  /** Forgets the account on this device, after it signed out or the server ended the session. */
  forget(): void {
    this.changes += 1;
    this.state.set(null);
    this.confirmed.set(false);
    this.chosenWorkshopId.set(null);
    store(SESSION_KEY, null);
    store(WORKSHOP_KEY, null);
  }

  /** Takes a workshop the server just created, renamed or let the account join. */
  keepWorkshop(workshop: WorkshopView): void {
    const session = this.state();
    if (session === null) return;
    const known = session.workshops.some((entry) => entry.id === workshop.id);
    const workshops = known
      ? session.workshops.map((entry) => (entry.id === workshop.id ? workshop : entry))
      : [...session.workshops, workshop];
    this.keep({ ...session, workshops });
  }

  dropWorkshop(workshopId: string): void {
    const session = this.state();
    if (session === null) return;
    this.keep({ ...session, workshops: session.workshops.filter((entry) => entry.id !== workshopId) });
  }

  chooseWorkshop(workshopId: string): void {
    this.chosenWorkshopId.set(workshopId);
    store(WORKSHOP_KEY, workshopId);
  }

  private async load(): Promise<void> {
    const changes = this.changes;
    try {
      const session = await firstValueFrom(this.http.get<SessionView>('/api/account'));
      if (changes === this.changes) this.keep(session);
    } catch (error) {
      if (!(error instanceof HttpErrorResponse)) throw error;
      // Only the server saying so signs the device out; no connection, or a server in trouble, keeps the
      // last known session, stale.
      if (error.status === 401 && changes === this.changes) this.forget();
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

function store(key: string, value: string | null): void {
  try {
    if (value === null) localStorage.removeItem(key);
    else localStorage.setItem(key, value);
  } catch {
    // Private browsing or a full disk: the session holds for this visit only.
  }
}

function storedSession(): SessionView | null {
  try {
    const session = JSON.parse(stored(SESSION_KEY) ?? 'null') as Partial<SessionView> | null;
    return typeof session?.account?.id === 'string' && Array.isArray(session.workshops)
      ? (session as SessionView)
      : null;
  } catch {
    return null;
  }
}
