import { hash, verify } from "@node-rs/argon2";

/**
 * Argon2id with the OWASP Password Storage Cheat Sheet's first row:
 * m = 19456 KiB, t = 2, p = 1. (@node-rs/argon2's Algorithm.Argon2id is the
 * const enum value 2; a const enum cannot be imported under isolatedModules.)
 */
export const ARGON2_OPTIONS = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(phc: string, password: string): Promise<boolean> {
  try {
    return await verify(phc, password);
  } catch {
    return false;
  }
}

/** A hash of a random password, verified against when the account does not exist so timing does not tell. */
let dummyHash: Promise<string> | undefined;
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword(`no-such-account-${Math.random()}`);
  return dummyHash;
}
