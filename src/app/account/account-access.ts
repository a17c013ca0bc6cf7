import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  emailOnlyRequestSchema,
  resetPasswordRequestSchema,
  SignUpRequest,
  verifyEmailRequestSchema,
} from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';
import type * as z from 'zod';
import { AccountSession } from '../core/account-session';

/** The server's answer where it must not tell whether an address has an account. */
interface MessageAnswer {
  readonly message: string;
}

/** Getting into an account: creating it, confirming its address, and a new password when the old one is lost. */
@Injectable({ providedIn: 'root' })
export class AccountAccess {
  private readonly http = inject(HttpClient);
  private readonly session = inject(AccountSession);

  /** The message says what happens next; it reads the same whether or not the address had an account. */
  async signUp(request: SignUpRequest): Promise<string> {
    return (await firstValueFrom(this.http.post<MessageAnswer>('/api/auth/sign-up', request))).message;
  }

  async verifyEmail(request: z.output<typeof verifyEmailRequestSchema>): Promise<void> {
    await firstValueFrom(this.http.post<unknown>('/api/auth/verify', request));
  }

  async resendVerification(request: z.output<typeof emailOnlyRequestSchema>): Promise<string> {
    return (await firstValueFrom(this.http.post<MessageAnswer>('/api/auth/verify/resend', request))).message;
  }

  async forgotPassword(request: z.output<typeof emailOnlyRequestSchema>): Promise<string> {
    return (await firstValueFrom(this.http.post<MessageAnswer>('/api/auth/forgot', request))).message;
  }

  /** Every session of the account ends, this device's too. */
  async resetPassword(request: z.output<typeof resetPasswordRequestSchema>): Promise<void> {
    await firstValueFrom(this.http.post<void>('/api/auth/reset', request));
    this.session.forget();
  }
}
