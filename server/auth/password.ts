// Password hashing with argon2id, the winner of the Password Hashing Competition (RFC 9106).
import { hash, verify } from '@node-rs/argon2';

/**
 * OWASP Password Storage Cheat Sheet's first argon2id configuration: m = 19 MiB, t = 2, p = 1
 * (about 70 ms per hash on this project's 2-core test machine). The parameters are written into each
 * PHC string, so raising them later still verifies older hashes.
 */
export const argon2Options = {
  algorithm: 2, // Algorithm.Argon2id; the package exports it as a const enum, which isolatedModules cannot inline
  memoryCost: 19_456, // KiB
  timeCost: 2,
  parallelism: 1,
} as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, argon2Options);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    // A malformed stored hash is a failed sign-in, not a 500 that tells the caller the account exists.
    return false;
  }
}

let decoyHash: Promise<string> | undefined;

/**
 * Spends the same argon2 work as a real check when the email is unknown, so the response time does
 * not tell a caller which emails have accounts.
 */
export async function verifyAgainstDecoy(password: string): Promise<false> {
  decoyHash ??= hashPassword('orbitab-decoy-password-never-valid');
  await verifyPassword(await decoyHash, password);
  return false;
}
