import { sql } from 'drizzle-orm';
import type { Role } from '../../shared/account-schemas.js';
import { hashPassword } from '../auth/passwords.js';
import type { ServerContext } from '../context.js';
import { memberships, users } from '../db/schema/index.js';
import { createWorkshop } from '../workshops/workshop-service.js';
import { seedDemoBench } from './demo-records.js';

/** The invented demo club and its three invented members, one for each role. */
export const DEMO_WORKSHOP = 'Fernhollow Model Railway Circle';
export const DEMO_MEMBERS: readonly { email: string; displayName: string; password: string; role: Role }[] = [
  { email: 'wren@fernhollow.test', displayName: 'Wren Halloway', password: 'fernhollow-owner', role: 'owner' },
  { email: 'ilse@fernhollow.test', displayName: 'Ilse Marrow', password: 'fernhollow-builder', role: 'builder' },
  { email: 'tobin@fernhollow.test', displayName: 'Tobin Reed', password: 'fernhollow-viewer', role: 'viewer' },
];

/** Fills an empty database with the demo scenario; leaves a database with any account alone. */
export async function seedDemoWhenEmpty(ctx: ServerContext): Promise<'seeded' | 'kept'> {
  const { db } = ctx;
  const [row] = await db.select({ count: sql<number>`count(*)::int` }).from(users);
  if ((row?.count ?? 0) > 0) return 'kept';
  const hashes = await Promise.all(DEMO_MEMBERS.map((member) => hashPassword(member.password)));
  const club = await db.transaction(async (tx) => {
    const created = [];
    for (const [index, member] of DEMO_MEMBERS.entries()) {
      const [user] = await tx
        .insert(users)
        .values({
          email: member.email,
          displayName: member.displayName,
          passwordHash: hashes[index]!,
          emailVerifiedAt: new Date(),
        })
        .returning();
      await createWorkshop(tx, user!.id, `${member.displayName}'s bench`, true);
      created.push({ userId: user!.id, role: member.role });
    }
    const workshop = await createWorkshop(tx, created[0]!.userId, DEMO_WORKSHOP);
    await tx.insert(memberships).values(created.slice(1).map((member) => ({ workshopId: workshop.id, ...member })));
    return { id: workshop.id, ownerId: created[0]!.userId, builderId: created[1]!.userId };
  });
  await seedDemoBench(ctx, club.ownerId, club.builderId, club.id);
  return 'seeded';
}
