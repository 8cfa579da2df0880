import { hash, verify } from '@node-rs/argon2';

/** argon2id with the OWASP Password Storage Cheat Sheet's first option: 19 MiB, t=2, p=1. */
export const ARGON2_OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export const hashPassword = (password: string) => hash(password, ARGON2_OPTIONS);

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A fixed hash to verify against when the e-mail is unknown, so timing does not reveal accounts. */
let dummyHash: Promise<string> | undefined;
export const dummyPasswordHash = () => (dummyHash ??= hashPassword('not-a-real-password-0000'));
