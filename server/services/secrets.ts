/**
 * Random secrets handed to a person (refresh cookie, e-mailed links, the master's brief link) and
 * the hash we keep instead: only the sha256 of a secret is stored, so a copy of the database
 * cannot use any of them.
 */
import { createHash, randomBytes } from 'node:crypto';

/** 256 random bits, base64url (43 characters). */
export const newSecret = (): string => randomBytes(32).toString('base64url');

export const hashSecret = (secret: string): string => createHash('sha256').update(secret, 'utf8').digest('hex');

/** A new secret and the hash to store. */
export function issueSecret(): { token: string; hash: string } {
  const token = newSecret();
  return { token, hash: hashSecret(token) };
}

/** Cheap shape check before any database work: a malformed secret is just another unknown one. */
export const looksLikeSecret = (s: string): boolean => /^[A-Za-z0-9_-]{43}$/.test(s);
