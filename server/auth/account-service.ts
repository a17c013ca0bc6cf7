import { and, eq, inArray, sql } from 'drizzle-orm';
import type { SessionView } from '../../shared/account-schemas.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { memberships, users, workshops } from '../db/schema/index.js';
import { copyKeysOf, removeCopies } from '../photos/photo-records.js';
import { workshopsOf } from '../workshops/workshop-service.js';
import { hashPassword, refuseCommonPassword, verifyPassword } from './passwords.js';

export async function sessionView(ctx: ServerContext, userId: string): Promise<SessionView> {
  const [user] = await ctx.db.select().from(users).where(eq(users.id, userId));
  if (!user) throw new AppError(401, 'signed_out', 'Sign in to do this.');
  return {
    account: {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      emailVerified: user.emailVerifiedAt !== null,
    },
    workshops: await workshopsOf(ctx.db, userId),
  };
}

export async function renameAccount(ctx: ServerContext, userId: string, displayName: string): Promise<SessionView> {
  await ctx.db.update(users).set({ displayName, updatedAt: ctx.clock.now() }).where(eq(users.id, userId));
  return sessionView(ctx, userId);
}

async function checkPassword(ctx: ServerContext, userId: string, password: string, field: string): Promise<void> {
  const [user] = await ctx.db.select({ hash: users.passwordHash }).from(users).where(eq(users.id, userId));
  if (!user?.hash || !(await verifyPassword(user.hash, password))) {
    throw new AppError(400, 'invalid', 'Some values need another look.', {
      [field]: 'This is not your current password.',
    });
  }
}

/** A new password ends every other session; this device stays signed in. */
export async function changePassword(
  ctx: ServerContext,
  userId: string,
  sessionId: string,
  current: string,
  next: string,
) {
  await checkPassword(ctx, userId, current, 'currentPassword');
  refuseCommonPassword(next, 'newPassword');
  await ctx.db
    .update(users)
    .set({ passwordHash: await hashPassword(next), updatedAt: ctx.clock.now() })
    .where(eq(users.id, userId));
  await ctx.sessions.endAllFor(userId, sessionId);
}

/**
 * Deleting an account deletes the workshops only it belongs to, with their builds and the files
 * of their photos. Where others remain and it is the only owner, deletion waits until it hands
 * ownership on: nothing another member relies on disappears without an owner's choice.
 */
export async function deleteAccount(ctx: ServerContext, userId: string, password: string): Promise<void> {
  await checkPassword(ctx, userId, password, 'password');
  const photoCopies = await ctx.db.transaction(async (tx) => {
    const mine = await tx
      .select({
        workshopId: memberships.workshopId,
        name: workshops.name,
        role: memberships.role,
        members: sql<number>`(SELECT count(*)::int FROM memberships m WHERE m.workshop_id = ${memberships.workshopId})`,
        owners: sql<number>`(SELECT count(*)::int FROM memberships m WHERE m.workshop_id = ${memberships.workshopId} AND m.role = 'owner')`,
      })
      .from(memberships)
      .innerJoin(workshops, eq(workshops.id, memberships.workshopId))
      .where(eq(memberships.userId, userId))
      .for('update', { of: memberships });
    const stranded = mine.filter((row) => row.role === 'owner' && row.owners === 1 && row.members > 1);
    if (stranded.length > 0) {
      throw new AppError(
        409,
        'sole_owner',
        `You are the only owner of ${stranded.map((row) => `"${row.name}"`).join(', ')}. Make another member an owner first, then delete your account.`,
      );
    }
    const onlyMine = mine.filter((row) => row.members === 1).map((row) => row.workshopId);
    const keys = await copyKeysOf(tx, onlyMine);
    if (onlyMine.length > 0) await tx.delete(workshops).where(inArray(workshops.id, onlyMine));
    await tx.delete(users).where(and(eq(users.id, userId)));
    return keys;
  });
  await removeCopies(ctx, photoCopies);
}
