import { and, asc, eq, sql } from 'drizzle-orm';
import type { MemberView, Role, WorkshopView } from '../../shared/account-schemas.js';
import { may, type WorkshopAction } from '../../shared/workshop-policy.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import type { Database } from '../db/database.js';
import { memberships, users, workshops } from '../db/schema/index.js';

type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
type Queryable = Database | Transaction;

export async function workshopsOf(db: Queryable, userId: string): Promise<WorkshopView[]> {
  return db
    .select({
      id: workshops.id,
      name: workshops.name,
      personal: workshops.personal,
      role: memberships.role,
      memberCount: sql<number>`(SELECT count(*)::int FROM memberships m WHERE m.workshop_id = ${workshops.id})`,
    })
    .from(memberships)
    .innerJoin(workshops, eq(workshops.id, memberships.workshopId))
    .where(eq(memberships.userId, userId))
    .orderBy(sql`${workshops.personal} DESC`, asc(workshops.name));
}

export async function createWorkshop(db: Queryable, userId: string, name: string, personal = false) {
  const [workshop] = await db.insert(workshops).values({ name, personal }).returning();
  await db.insert(memberships).values({ workshopId: workshop!.id, userId, role: 'owner' });
  return {
    id: workshop!.id,
    name: workshop!.name,
    personal: workshop!.personal,
    role: 'owner' as Role,
    memberCount: 1,
  };
}

/** The caller's role in a workshop if the policy lets them do the action; 404 to strangers. */
/** The refusal of something a member's role does not allow. */
export function forbidden(role: Role): AppError {
  return new AppError(403, 'forbidden', `As a ${role} of this workshop you may not do this.`);
}

export async function authorize(
  db: Queryable,
  userId: string,
  workshopId: string,
  action: WorkshopAction,
): Promise<Role> {
  const [membership] = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.workshopId, workshopId), eq(memberships.userId, userId)));
  if (!membership) throw new AppError(404, 'workshop_unknown', 'You are not a member of this workshop.');
  if (!may(membership.role, action)) {
    throw forbidden(membership.role);
  }
  return membership.role;
}

export async function renameWorkshop(ctx: ServerContext, userId: string, workshopId: string, name: string) {
  await authorize(ctx.db, userId, workshopId, 'rename');
  await ctx.db.update(workshops).set({ name, updatedAt: ctx.clock.now() }).where(eq(workshops.id, workshopId));
  return (await workshopsOf(ctx.db, userId)).find((workshop) => workshop.id === workshopId)!;
}

export async function membersOf(ctx: ServerContext, userId: string, workshopId: string): Promise<MemberView[]> {
  const role = await authorize(ctx.db, userId, workshopId, 'view');
  const showEmails = may(role, 'see-member-emails');
  const rows = await ctx.db
    .select({
      userId: users.id,
      displayName: users.displayName,
      email: users.email,
      role: memberships.role,
      joinedAt: memberships.createdAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.workshopId, workshopId))
    .orderBy(asc(memberships.createdAt));
  return rows.map((row) => ({
    userId: row.userId,
    displayName: row.displayName,
    ...(showEmails ? { email: row.email } : {}),
    role: row.role,
    joinedAt: row.joinedAt.toISOString(),
  }));
}

/**
 * Changes or ends a membership while keeping at least one owner. The workshop's memberships are
 * locked for the check, so two owners stepping down at once cannot both succeed.
 */
async function changeMembership(ctx: ServerContext, workshopId: string, memberId: string, newRole: Role | null) {
  return ctx.db.transaction(async (tx) => {
    const current = await tx
      .select({ userId: memberships.userId, role: memberships.role })
      .from(memberships)
      .where(eq(memberships.workshopId, workshopId))
      .for('update');
    const member = current.find((row) => row.userId === memberId);
    if (!member) throw new AppError(404, 'member_unknown', 'This person is not a member of the workshop.');
    const ownersAfter = current.filter((row) => (row.userId === memberId ? newRole : row.role) === 'owner').length;
    if (ownersAfter === 0) {
      throw new AppError(409, 'last_owner', 'A workshop needs at least one owner: make someone else an owner first.');
    }
    const where = and(eq(memberships.workshopId, workshopId), eq(memberships.userId, memberId));
    if (newRole === null) await tx.delete(memberships).where(where);
    else await tx.update(memberships).set({ role: newRole }).where(where);
  });
}

export async function changeRole(ctx: ServerContext, userId: string, workshopId: string, memberId: string, role: Role) {
  await authorize(ctx.db, userId, workshopId, 'manage-members');
  await changeMembership(ctx, workshopId, memberId, role);
  const members = await membersOf(ctx, userId, workshopId);
  return members.find((member) => member.userId === memberId)!;
}

/** An owner removes anyone; anyone may remove themself (leave). */
export async function removeMember(ctx: ServerContext, userId: string, workshopId: string, memberId: string) {
  await authorize(ctx.db, userId, workshopId, memberId === userId ? 'view' : 'manage-members');
  await changeMembership(ctx, workshopId, memberId, null);
}
