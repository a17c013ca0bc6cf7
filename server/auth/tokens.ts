import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * E-mailed tokens are `<record id without dashes>_<secret>`: the id finds the record, the
 * secret proves possession. Only a SHA-256 of the secret is stored, compared in constant time.
 */
export interface IssuedToken {
  token: string;
  secretHash: string;
}

export function issueToken(recordId: string): IssuedToken {
  const secret = randomBytes(32).toString('base64url');
  return { token: `${recordId.replaceAll('-', '')}_${secret}`, secretHash: hashSecret(secret) };
}

export function readToken(token: string): { recordId: string; secret: string } | null {
  const match = /^([0-9a-f]{32})_([A-Za-z0-9_-]{43})$/.exec(token);
  if (!match) return null;
  const hex = match[1]!;
  const recordId = `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
  return { recordId, secret: match[2]! };
}

export function secretMatches(secret: string, storedHash: string): boolean {
  const given = Buffer.from(hashSecret(secret), 'hex');
  const stored = Buffer.from(storedHash, 'hex');
  return given.length === stored.length && timingSafeEqual(given, stored);
}

function hashSecret(secret: string): string {
  return createHash('sha256').update(secret).digest('hex');
}
