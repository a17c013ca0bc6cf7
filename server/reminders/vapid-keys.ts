import { eq } from 'drizzle-orm';
import webpush from 'web-push';
import type { Database } from '../db/database.js';
import { serverKeys } from '../db/schema/reminders.js';

export interface VapidKeys {
  publicKey: string;
  privateKey: string;
}

/**
 * The server's VAPID key pair, made on first use and kept in the database so every API process
 * signs with the same key (browsers subscribe against the public one). The first process to
 * insert wins; the others read what it wrote.
 */
export async function vapidKeys(db: Database): Promise<VapidKeys> {
  const [stored] = await db.select().from(serverKeys).where(eq(serverKeys.name, 'vapid'));
  if (stored) return keyPair(stored.value);
  const fresh = webpush.generateVAPIDKeys();
  await db
    .insert(serverKeys)
    .values({ name: 'vapid', value: { ...fresh } })
    .onConflictDoNothing();
  const [kept] = await db.select().from(serverKeys).where(eq(serverKeys.name, 'vapid'));
  return keyPair(kept!.value);
}

function keyPair({ publicKey, privateKey }: Record<string, string>): VapidKeys {
  if (!publicKey || !privateKey) throw new Error('The stored VAPID key pair lacks a key; remove it to make a new one.');
  return { publicKey, privateKey };
}
