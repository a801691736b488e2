import { hash, verify, Algorithm } from '@node-rs/argon2';

// OWASP ASVS 5.0 Appendix C: argon2id, m = 19456 KiB, t = 2, p = 1.
export const ARGON2_PARAMS = { algorithm: Algorithm.Argon2id, memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export const hashPassword = (password: string) => hash(password, ARGON2_PARAMS);

export async function verifyPassword(stored: string, password: string): Promise<boolean> {
  try {
    return await verify(stored, password);
  } catch {
    return false;
  }
}

// Verified against when the account does not exist, so timing does not reveal which e-mails exist.
let dummyHash: Promise<string> | null = null;
export function dummyVerify(password: string) {
  dummyHash ??= hashPassword('not-a-real-password-for-timing');
  return dummyHash.then((h) => verifyPassword(h, password));
}
