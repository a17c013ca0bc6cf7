import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { InvitationPreview, WorkshopView, workshopRequestSchema } from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';
import type * as z from 'zod';
import { AccountSession } from '../core/account-session';

type WorkshopRequest = z.output<typeof workshopRequestSchema>;

/** The workshops the account belongs to: starting one, renaming one, and joining one by invitation. */
@Injectable({ providedIn: 'root' })
export class Workshops {
  private readonly http = inject(HttpClient);
  private readonly session = inject(AccountSession);

  /** The new workshop becomes the current one. */
  async create(request: WorkshopRequest): Promise<void> {
    this.join(await firstValueFrom(this.http.post<WorkshopView>('/api/workshops', request)));
  }

  async rename(workshopId: string, request: WorkshopRequest): Promise<void> {
    const url = `/api/workshops/${encodeURIComponent(workshopId)}`;
    this.session.keepWorkshop(await firstValueFrom(this.http.patch<WorkshopView>(url, request)));
  }

  previewInvitation(token: string): Promise<InvitationPreview> {
    return firstValueFrom(this.http.get<InvitationPreview>(`/api/invitations/${encodeURIComponent(token)}`));
  }

  /** The joined workshop becomes the current one. */
  async acceptInvitation(token: string): Promise<WorkshopView> {
    const url = `/api/invitations/${encodeURIComponent(token)}/accept`;
    const workshop = await firstValueFrom(this.http.post<WorkshopView>(url, null));
    this.join(workshop);
    return workshop;
  }

  private join(workshop: WorkshopView): void {
    this.session.keepWorkshop(workshop);
    this.session.chooseWorkshop(workshop.id);
  }
}
