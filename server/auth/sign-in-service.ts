import { eq } from 'drizzle-orm';
import type * as z from 'zod';
import type {
  resetPasswordRequestSchema,
  signInRequestSchema,
  signUpRequestSchema,
} from '../../shared/account-schemas.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { users } from '../db/schema/index.js';
import { alreadySignedUpMessage, resetPasswordMessage, verifyEmailMessage } from '../mail/messages.js';
import { sendSafely } from '../mail/send-safely.js';
import { acceptInvitation, previewInvitation } from '../workshops/invitation-service.js';
import { createWorkshop } from '../workshops/workshop-service.js';
import { sessionView } from './account-service.js';
import { createEmailToken, spendEmailToken } from './email-tokens.js';
import { hashPassword, refuseCommonPassword, verifyAgainstDecoy, verifyPassword } from './passwords.js';
import { LIMITS, spendAttempt } from './rate-limit.js';

export const AFTER_SIGN_UP: Record<AfterSignUp, string> = {
  'confirm-email': 'Thanks. Check your e-mail: we sent a link to confirm the address.',
  'sign-in': 'Welcome: your account is ready and you have joined the workshop. Sign in to start.',
};
export const RESET_SENT = 'If an account uses this address, a link to choose a new password is on its way.';

async function userByEmail(ctx: ServerContext, email: string) {
  const [user] = await ctx.db.select().from(users).where(eq(users.email, email));
  return user;
}

/** What the person should do next: confirm by the e-mailed link, or sign in (an invitation proved the address). */
export type AfterSignUp = 'confirm-email' | 'sign-in';

export async function signUp(
  ctx: ServerContext,
  input: z.output<typeof signUpRequestSchema>,
  address: string,
): Promise<AfterSignUp> {
  await spendAttempt(ctx.db, ctx.clock, [
    { limit: LIMITS.signUpByAddress, subject: address },
    { limit: LIMITS.signUpByAccount, subject: input.email },
  ]);
  refuseCommonPassword(input.password);
  const existing = await userByEmail(ctx, input.email);
  if (existing) {
    await sendSafely(
      ctx,
      alreadySignedUpMessage(input.email, existing.displayName, `${ctx.config.publicOrigin}/sign-in`),
    );
    return 'confirm-email';
  }
  // An invitation sent to this address proves it, so that account starts out confirmed.
  const invitation = input.invitationToken
    ? await previewInvitation(ctx, input.invitationToken).catch(() => null)
    : null;
  const proven = invitation !== null && invitation.email === input.email;
  const passwordHash = await hashPassword(input.password);
  const user = await ctx.db.transaction(async (tx) => {
    const [created] = await tx
      .insert(users)
      .values({
        email: input.email,
        displayName: input.displayName,
        passwordHash,
        emailVerifiedAt: proven ? ctx.clock.now() : null,
      })
      .returning();
    await createWorkshop(tx, created!.id, `${input.displayName}'s bench`, true);
    return created!;
  });
  if (proven) {
    await acceptInvitation(ctx, user, input.invitationToken!);
    return 'sign-in';
  }
  const token = await createEmailToken(ctx, user.id, 'verify-email');
  await sendSafely(
    ctx,
    verifyEmailMessage(user.email, user.displayName, `${ctx.config.publicOrigin}/verify?token=${token}`),
  );
  return 'confirm-email';
}

export async function verifyEmail(ctx: ServerContext, token: string): Promise<void> {
  const userId = await spendEmailToken(ctx, token, 'verify-email');
  await ctx.db
    .update(users)
    .set({ emailVerifiedAt: ctx.clock.now(), updatedAt: ctx.clock.now() })
    .where(eq(users.id, userId));
}

export async function resendVerification(ctx: ServerContext, email: string, address: string): Promise<void> {
  await spendAttempt(ctx.db, ctx.clock, [
    { limit: LIMITS.emailByAddress, subject: address },
    { limit: LIMITS.emailByAccount, subject: email },
  ]);
  const user = await userByEmail(ctx, email);
  if (!user || user.emailVerifiedAt) return;
  const token = await createEmailToken(ctx, user.id, 'verify-email');
  await sendSafely(
    ctx,
    verifyEmailMessage(user.email, user.displayName, `${ctx.config.publicOrigin}/verify?token=${token}`),
  );
}

export async function signIn(ctx: ServerContext, input: z.output<typeof signInRequestSchema>, address: string) {
  await spendAttempt(ctx.db, ctx.clock, [
    { limit: LIMITS.signInByAddress, subject: address },
    { limit: LIMITS.signInByAccount, subject: input.email },
  ]);
  const user = await userByEmail(ctx, input.email);
  const matches = user?.passwordHash
    ? await verifyPassword(user.passwordHash, input.password)
    : await verifyAgainstDecoy(input.password);
  if (!user || !matches) {
    throw new AppError(401, 'invalid_credentials', 'That e-mail and password do not match an account.');
  }
  if (!user.emailVerifiedAt) {
    throw new AppError(
      403,
      'email_not_verified',
      'Confirm your e-mail first: follow the link we sent, or ask for a new one.',
    );
  }
  const { cookie } = await ctx.sessions.create(user.id);
  return { cookie, view: await sessionView(ctx, user.id) };
}

export async function requestPasswordReset(ctx: ServerContext, email: string, address: string): Promise<void> {
  await spendAttempt(ctx.db, ctx.clock, [
    { limit: LIMITS.emailByAddress, subject: address },
    { limit: LIMITS.emailByAccount, subject: email },
  ]);
  const user = await userByEmail(ctx, email);
  if (!user) return;
  const token = await createEmailToken(ctx, user.id, 'reset-password');
  await sendSafely(
    ctx,
    resetPasswordMessage(user.email, user.displayName, `${ctx.config.publicOrigin}/reset-password?token=${token}`),
  );
}

export async function resetPassword(
  ctx: ServerContext,
  input: z.output<typeof resetPasswordRequestSchema>,
): Promise<void> {
  refuseCommonPassword(input.newPassword, 'newPassword');
  const userId = await spendEmailToken(ctx, input.token, 'reset-password');
  const passwordHash = await hashPassword(input.newPassword);
  // Following the link proves the address too.
  const now = ctx.clock.now();
  await ctx.db.update(users).set({ passwordHash, emailVerifiedAt: now, updatedAt: now }).where(eq(users.id, userId));
  await ctx.sessions.endAllFor(userId);
}
