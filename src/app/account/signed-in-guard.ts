import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import { AccountSession } from '../core/account-session';

/**
 * Screens that need an account send a signed-out modeller to sign in, and back here afterwards. It waits for
 * the server's answer at start; offline, the session this device last knew lets them through.
 */
export const signedInGuard: CanActivateFn = async (_route, state) => {
  const session = inject(AccountSession);
  const router = inject(Router);
  await session.settled();
  return session.signedIn() || router.createUrlTree(['/sign-in'], { queryParams: { returnTo: state.url } });
};
