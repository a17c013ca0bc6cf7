import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  changePasswordRequestSchema,
  deleteAccountRequestSchema,
  SessionView,
  updateAccountRequestSchema,
} from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';
import type * as z from 'zod';
import { AccountSession } from '../core/account-session';

/** Changes to the signed-in account itself. */
@Injectable({ providedIn: 'root' })
export class AccountSettings {
  private readonly http = inject(HttpClient);
  private readonly session = inject(AccountSession);

  async rename(request: z.output<typeof updateAccountRequestSchema>): Promise<void> {
    this.session.keep(await firstValueFrom(this.http.patch<SessionView>('/api/account', request)));
  }

  /** The other sessions end; this one stays. */
  async changePassword(request: z.output<typeof changePasswordRequestSchema>): Promise<void> {
    await firstValueFrom(this.http.post<void>('/api/account/password', request));
  }

  async deleteAccount(request: z.output<typeof deleteAccountRequestSchema>): Promise<void> {
    await firstValueFrom(this.http.delete<void>('/api/account', { body: request }));
    this.session.forget();
  }
}
