import { randomBytes } from 'node:crypto';

import bcrypt from 'bcryptjs';

const bcryptCost = 10;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, bcryptCost);
}

let decoyHash: Promise<string> | undefined;

/**
 * Compares a password with a stored hash. With no hash (unknown e-mail) it still runs a full compare against
 * a decoy, so response time doesn't tell an attacker which addresses have accounts.
 */
export async function verifyPassword(plain: string, hash: string | null): Promise<boolean> {
  if (hash === null) {
    decoyHash ??= bcrypt.hash(randomBytes(24).toString('base64'), bcryptCost);
    await bcrypt.compare(plain, await decoyHash);
    return false;
  }
  return bcrypt.compare(plain, hash);
}
