import { may } from '@benchtide/shared';
import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, linkedSignal, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { InvitationView, invitationRequestSchema, MemberView, Role } from '@benchtide/shared';
import { catchError, firstValueFrom, forkJoin, map, of, startWith, switchMap, type Observable } from 'rxjs';
import type * as z from 'zod';
import { AccountSession } from '../core/account-session';
import { apiError, type ApiProblem } from '../core/api-error';

interface Roster {
  readonly loading: boolean;
  readonly members: readonly MemberView[];
  readonly invitations: readonly InvitationView[];
  readonly problem: ApiProblem | null;
}

const LOADING: Roster = { loading: true, members: [], invitations: [], problem: null };
const EMPTY: Roster = { ...LOADING, loading: false };

/** Who is in the current workshop and who is invited to it; provided by the Workshop screen. */
@Injectable()
export class WorkshopRoster {
  private readonly http = inject(HttpClient);
  private readonly session = inject(AccountSession);

  private readonly reloads = signal(0);
  /** Invitations are the owners' business: the server refuses them to anyone else. */
  private readonly source = computed(
    () => ({
      workshopId: this.session.currentWorkshopId(),
      owner: may(this.session.currentWorkshop()?.role, 'manage-invitations'),
      reload: this.reloads(),
    }),
    { equal: (a, b) => a.workshopId === b.workshopId && a.owner === b.owner && a.reload === b.reload },
  );
  private readonly roster = toSignal(
    toObservable(this.source).pipe(
      switchMap(({ workshopId, owner }) => (workshopId === null ? of(EMPTY) : this.fetch(workshopId, owner))),
    ),
    { initialValue: LOADING },
  );

  readonly loading = computed(() => this.roster().loading);
  readonly problem = computed(() => this.roster().problem);
  readonly members = linkedSignal(() => this.roster().members);
  readonly invitations = linkedSignal(() => this.roster().invitations);

  reload(): void {
    this.reloads.update((count) => count + 1);
  }

  async changeRole(member: MemberView, role: Role): Promise<void> {
    const changed = await firstValueFrom(
      this.http.patch<MemberView>(`${this.workshopUrl()}/members/${encodeURIComponent(member.userId)}`, { role }),
    );
    this.members.update((members) => members.map((entry) => (entry.userId === changed.userId ? changed : entry)));
    // Owners who step down lose what the screen showed them as owners.
    if (member.userId === this.session.account()?.id) await this.session.refresh();
  }

  /** Removes a member; removing oneself is leaving, and the workshop goes from this device's list. */
  async remove(member: MemberView): Promise<void> {
    const workshopId = this.session.currentWorkshopId();
    await firstValueFrom(this.http.delete<void>(`${this.workshopUrl()}/members/${encodeURIComponent(member.userId)}`));
    if (member.userId === this.session.account()?.id && workshopId !== null) {
      this.session.dropWorkshop(workshopId);
      return;
    }
    this.members.update((members) => members.filter((entry) => entry.userId !== member.userId));
  }

  async invite(request: z.output<typeof invitationRequestSchema>): Promise<void> {
    const invitation = await firstValueFrom(
      this.http.post<InvitationView>(`${this.workshopUrl()}/invitations`, request),
    );
    this.invitations.update((invitations) => [...invitations, invitation]);
  }

  async withdraw(invitation: InvitationView): Promise<void> {
    await firstValueFrom(
      this.http.delete<void>(`${this.workshopUrl()}/invitations/${encodeURIComponent(invitation.id)}`),
    );
    this.invitations.update((invitations) => invitations.filter((entry) => entry.id !== invitation.id));
  }

  private workshopUrl(): string {
    return `/api/workshops/${encodeURIComponent(this.session.currentWorkshopId() ?? '')}`;
  }

  private fetch(workshopId: string, owner: boolean): Observable<Roster> {
    const url = `/api/workshops/${encodeURIComponent(workshopId)}`;
    return forkJoin({
      members: this.http.get<MemberView[]>(`${url}/members`),
      invitations: owner ? this.http.get<InvitationView[]>(`${url}/invitations`) : of<InvitationView[]>([]),
    }).pipe(
      map(({ members, invitations }) => ({ loading: false, members, invitations, problem: null })),
      catchError((error: unknown) => {
        if (!(error instanceof HttpErrorResponse)) throw error;
        return of({ ...EMPTY, problem: apiError(error) });
      }),
      startWith(LOADING),
    );
  }
}
