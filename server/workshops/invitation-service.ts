import { and, eq, gt, isNull } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';
import type { InvitationPreview, InvitationView, Role, WorkshopView } from '../../shared/account-schemas.js';
import { issueToken, readToken, secretMatches } from '../auth/tokens.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { invitations, memberships, users, workshops } from '../db/schema/index.js';
import { invitationMessage } from '../mail/messages.js';
import { sendSafely } from '../mail/send-safely.js';
import { authorize, workshopsOf } from './workshop-service.js';

const INVITATION_DAYS = 7;

function view(row: typeof invitations.$inferSelect, invitedBy: string | null): InvitationView {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    invitedBy: invitedBy ?? 'a former member',
    expiresAt: row.expiresAt.toISOString(),
  };
}

export async function openInvitations(ctx: ServerContext, userId: string, workshopId: string) {
  await authorize(ctx.db, userId, workshopId, 'manage-invitations');
  const rows = await ctx.db
    .select({ invitation: invitations, invitedBy: users.displayName })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(
      and(
        eq(invitations.workshopId, workshopId),
        isNull(invitations.acceptedAt),
        gt(invitations.expiresAt, ctx.clock.now()),
      ),
    );
  return rows.map((row) => view(row.invitation, row.invitedBy));
}

export async function invite(
  ctx: ServerContext,
  inviter: { id: string; displayName: string },
  workshopId: string,
  email: string,
  role: Role,
) {
  await authorize(ctx.db, inviter.id, workshopId, 'manage-invitations');
  const [workshop] = await ctx.db.select().from(workshops).where(eq(workshops.id, workshopId));
  const id = randomUUID();
  const { token, secretHash } = issueToken(id);
  const expiresAt = new Date(ctx.clock.now().getTime() + INVITATION_DAYS * 24 * 3_600_000);
  const [row] = await ctx.db
    .insert(invitations)
    .values({ id, workshopId, email, role, secretHash, invitedBy: inviter.id, expiresAt })
    .returning();
  const url = `${ctx.config.publicOrigin}/invitations/${token}`;
  await sendSafely(ctx, invitationMessage(email, inviter.displayName, workshop!.name, role, url));
  return view(row!, inviter.displayName);
}

export async function revokeInvitation(ctx: ServerContext, userId: string, workshopId: string, invitationId: string) {
  await authorize(ctx.db, userId, workshopId, 'manage-invitations');
  const removed = await ctx.db
    .delete(invitations)
    .where(and(eq(invitations.id, invitationId), eq(invitations.workshopId, workshopId)))
    .returning({ id: invitations.id });
  if (removed.length === 0) throw new AppError(404, 'invitation_unknown', 'There is no such invitation.');
}

/** The invitation a token stands for, if it is still good; clear errors otherwise. */
async function usableInvitation(ctx: ServerContext, token: string) {
  const parts = readToken(token);
  const unknown = new AppError(
    404,
    'invitation_unknown',
    'This invitation link is not valid or has already been used.',
  );
  if (!parts) throw unknown;
  const [row] = await ctx.db
    .select({ invitation: invitations, workshopName: workshops.name, invitedBy: users.displayName })
    .from(invitations)
    .innerJoin(workshops, eq(workshops.id, invitations.workshopId))
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.id, parts.recordId));
  if (!row || row.invitation.acceptedAt || !secretMatches(parts.secret, row.invitation.secretHash)) throw unknown;
  if (row.invitation.expiresAt <= ctx.clock.now()) {
    throw new AppError(410, 'invitation_expired', 'This invitation has expired. Ask the workshop owner for a new one.');
  }
  return row;
}

export async function previewInvitation(ctx: ServerContext, token: string): Promise<InvitationPreview> {
  const row = await usableInvitation(ctx, token);
  return {
    workshopName: row.workshopName,
    role: row.invitation.role,
    invitedBy: row.invitedBy ?? 'a former member',
    email: row.invitation.email,
    expiresAt: row.invitation.expiresAt.toISOString(),
  };
}

/** Joins the workshop with the invited role (keeping a higher role held already); single use. */
export async function acceptInvitation(
  ctx: ServerContext,
  user: { id: string; email: string },
  token: string,
): Promise<WorkshopView> {
  const row = await usableInvitation(ctx, token);
  if (row.invitation.email !== user.email) {
    throw new AppError(
      403,
      'invitation_other_email',
      `This invitation was sent to ${row.invitation.email}; sign in with that address to accept it.`,
    );
  }
  await ctx.db.transaction(async (tx) => {
    const used = await tx
      .update(invitations)
      .set({ acceptedAt: ctx.clock.now() })
      .where(and(eq(invitations.id, row.invitation.id), isNull(invitations.acceptedAt)))
      .returning({ id: invitations.id });
    if (used.length === 0) throw new AppError(404, 'invitation_unknown', 'This invitation has already been used.');
    const [existing] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.workshopId, row.invitation.workshopId), eq(memberships.userId, user.id)));
    const rank: Record<Role, number> = { viewer: 0, builder: 1, owner: 2 };
    const role = existing && rank[existing.role] >= rank[row.invitation.role] ? existing.role : row.invitation.role;
    await tx
      .insert(memberships)
      .values({ workshopId: row.invitation.workshopId, userId: user.id, role })
      .onConflictDoUpdate({ target: [memberships.workshopId, memberships.userId], set: { role } });
  });
  return (await workshopsOf(ctx.db, user.id)).find((workshop) => workshop.id === row.invitation.workshopId)!;
}
