// Password hashing with argon2id (RFC 9106). Parameters: the OWASP Password Storage Cheat Sheet's
// argon2id minimum of 19 MiB memory, 2 iterations, 1 degree of parallelism.
import { hash, verify } from "@node-rs/argon2";

const OPTIONS = { algorithm: 2 /* Argon2id */, memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(stored: string | null, password: string): Promise<boolean> {
  // Without a stored hash, still spend the time of one check, so timing does not tell which e-mail exists.
  if (!stored) {
    await hash(password, OPTIONS);
    return false;
  }
  try {
    return await verify(stored, password);
  } catch {
    return false;
  }
}
