import { createHash, randomBytes } from 'node:crypto';

/** A link token (256 random bits, base64url) and the SHA-256 kept in the database. */
export function newLinkToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashLinkToken(token) };
}

export const hashLinkToken = (token: string): string => createHash('sha256').update(token).digest('hex');

export const hoursFromNow = (hours: number): Date => new Date(Date.now() + hours * 3600_000);
