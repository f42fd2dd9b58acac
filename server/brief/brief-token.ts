/**
 * Master's brief tokens: 32 random bytes (256 bits) in base64url, 43 characters. Only the sha256
 * of a token is stored, so a copy of the database cannot open any brief.
 */
import { createHash, randomBytes } from 'node:crypto';

export const BRIEF_TOKEN_BYTES = 32;
const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

export function newBriefToken(): { token: string; hash: string } {
  const token = randomBytes(BRIEF_TOKEN_BYTES).toString('base64url');
  return { token, hash: hashBriefToken(token) };
}

export function hashBriefToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** Cheap shape check before any database work; a malformed token is just another unknown one. */
export function looksLikeBriefToken(token: string): boolean {
  return TOKEN_PATTERN.test(token);
}

export const briefPath = (token: string) => `/brief/${token}`;
