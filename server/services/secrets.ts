/** Random secrets sent to a person (refresh cookie, e-mailed links) and the hash we keep instead. */
import { createHash, randomBytes } from 'node:crypto';

/** 256 random bits, base64url (43 characters). */
export const newSecret = (): string => randomBytes(32).toString('base64url');

export const hashSecret = (secret: string): string => createHash('sha256').update(secret).digest('hex');
