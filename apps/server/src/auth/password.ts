import { hash, verify } from '@node-rs/argon2';

// Argon2id with the OWASP Password Storage Cheat Sheet's minimum (19 MiB, 2 iterations, 1 lane).
const options = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export const hashPassword = (password: string) => hash(password, options);

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}
