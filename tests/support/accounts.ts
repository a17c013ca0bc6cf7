import { randomUUID } from 'node:crypto';
import type { Role } from '../../shared/account-schemas.js';
import { hashPassword } from '../../server/auth/passwords.js';
import type { ServerContext } from '../../server/context.js';
import { memberships, users } from '../../server/db/schema/index.js';
import { createWorkshop } from '../../server/workshops/workshop-service.js';

export const GOOD_PASSWORD = 'mossy riverbank 1:87';

export interface TestAccount {
  id: string;
  email: string;
  displayName: string;
  password: string;
  /** The Cookie header of a signed-in session of this account. */
  cookie: string;
}

let goodPasswordHash: Promise<string> | undefined;

export function uniqueEmail(who: string): string {
  return `${who.toLowerCase()}-${randomUUID().slice(0, 8)}@benchtide.test`;
}

/** A confirmed account made straight in the database, signed in through the session store. */
export async function makeAccount(ctx: ServerContext, who: string): Promise<TestAccount> {
  const email = uniqueEmail(who);
  const [user] = await ctx.db
    .insert(users)
    .values({
      email,
      displayName: who,
      passwordHash: await (goodPasswordHash ??= hashPassword(GOOD_PASSWORD)),
      emailVerifiedAt: new Date(),
    })
    .returning();
  const { cookie } = await ctx.sessions.create(user!.id);
  return { id: user!.id, email, displayName: who, password: GOOD_PASSWORD, cookie: cookie.split(';')[0]! };
}

export async function makeWorkshop(ctx: ServerContext, owner: TestAccount, name = 'Test workshop') {
  return createWorkshop(ctx.db, owner.id, name);
}

export async function addMember(ctx: ServerContext, workshopId: string, account: TestAccount, role: Role) {
  await ctx.db.insert(memberships).values({ workshopId, userId: account.id, role });
}
