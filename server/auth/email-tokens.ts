import { and, eq, isNull } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { emailTokens } from '../db/schema/index.js';
import { issueToken, readToken, secretMatches } from './tokens.js';

export type TokenPurpose = 'verify-email' | 'reset-password';

const LIFETIME_MINUTES: Record<TokenPurpose, number> = { 'verify-email': 24 * 60, 'reset-password': 60 };

export async function createEmailToken(ctx: ServerContext, userId: string, purpose: TokenPurpose): Promise<string> {
  const id = randomUUID();
  const { token, secretHash } = issueToken(id);
  const expiresAt = new Date(ctx.clock.now().getTime() + LIFETIME_MINUTES[purpose] * 60_000);
  await ctx.db.insert(emailTokens).values({ id, userId, purpose, secretHash, expiresAt });
  return token;
}

/** Marks a token used and answers its account; expired, used, unknown or altered tokens are refused alike. */
export async function spendEmailToken(ctx: ServerContext, token: string, purpose: TokenPurpose): Promise<string> {
  const refused = new AppError(
    400,
    'token_invalid',
    'This link has expired or has already been used. Ask for a new one.',
  );
  const parts = readToken(token);
  if (!parts) throw refused;
  const [row] = await ctx.db.select().from(emailTokens).where(eq(emailTokens.id, parts.recordId));
  if (!row || row.purpose !== purpose || row.usedAt || !secretMatches(parts.secret, row.secretHash)) throw refused;
  if (row.expiresAt <= ctx.clock.now()) throw refused;
  const spent = await ctx.db
    .update(emailTokens)
    .set({ usedAt: ctx.clock.now() })
    .where(and(eq(emailTokens.id, row.id), isNull(emailTokens.usedAt)))
    .returning({ userId: emailTokens.userId });
  if (spent.length === 0) throw refused;
  return spent[0]!.userId;
}
