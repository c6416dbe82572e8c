import { hash, verify } from '@node-rs/argon2';

/**
 * argon2id (memory-hard) with the library's defaults: 19 MiB memory, 2 passes, 1 lane,
 * matching the minimum OWASP Password Storage Cheat Sheet recommends for argon2id.
 */
export const hashPassword = (password: string): Promise<string> => hash(password);

/** A hash of a random password, verified against when the e-mail is unknown, so timing does not tell. */
let decoyHash: Promise<string> | null = null;

export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  if (!passwordHash) {
    decoyHash ??= hash(`decoy-${Math.random()}`);
    await verify(await decoyHash, password).catch(() => false);
    return false;
  }
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}
