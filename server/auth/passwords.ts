import { dictionary } from '@zxcvbn-ts/language-common';
import { Argon2id } from 'oslo/password';
import { AppError } from '../core/app-error.js';

// OWASP's Argon2id minimum: 19 MiB of memory, 2 iterations, parallelism 1 (oslo's defaults, stated here on purpose).
const argon2id = new Argon2id({ memorySize: 19_456, iterations: 2, parallelism: 1 });
const COMMON_PASSWORDS = new Set(dictionary['passwords-common']);

export function hashPassword(password: string): Promise<string> {
  return argon2id.hash(password);
}

export function verifyPassword(hash: string, password: string): Promise<boolean> {
  return argon2id.verify(hash, password);
}

/** A password from the lists attackers try first is refused whatever its length. */
export function isCommonPassword(password: string): boolean {
  return COMMON_PASSWORDS.has(password.toLowerCase());
}

/** Keeps sign-in as slow for an unknown address as for a known one, so timing tells nothing. */
let decoyHash: Promise<string> | undefined;
export async function verifyAgainstDecoy(password: string): Promise<false> {
  decoyHash ??= argon2id.hash('benchtide decoy password that matches nothing');
  await argon2id.verify(await decoyHash, password);
  return false;
}

/** Answers 400 on the named field for a password from the common lists. */
export function refuseCommonPassword(password: string, field = 'password'): void {
  if (isCommonPassword(password)) {
    throw new AppError(400, 'invalid', 'Some values need another look.', {
      [field]: 'This password is one of the most common ones attackers try first. Choose another.',
    });
  }
}
