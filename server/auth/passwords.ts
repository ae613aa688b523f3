// Password hashing with argon2id (@node-rs/argon2, OWASP-recommended parameters).
import { hash, verify } from '@node-rs/argon2';

const OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  if (!passwordHash) return false;
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A hash of a random password, made once: the stand-in verified when there is no account. */
let standIn: Promise<string> | null = null;

/**
 * Spend the time of a real verification and answer false: for unknown addresses, disabled
 * accounts and accounts without a password, so sign-in timing does not reveal which it was.
 */
export async function verifyAgainstNothing(password: string): Promise<false> {
  await verifyPassword(await standInHash(), password);
  return false;
}

/** The stand-in hash itself (made with the same parameters as every real one). */
export function standInHash(): Promise<string> {
  standIn ??= hashPassword(`stand-in-${Math.random()}-${Date.now()}`);
  return standIn;
}
