import { createHash, randomBytes } from 'node:crypto';

/** A one-time token for a link: the secret goes in the e-mail, only its hash is stored. */
export interface LinkToken {
  readonly token: string;
  readonly hash: string;
}

/** 256 random bits, base64url (43 characters). */
export function newLinkToken(): LinkToken {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashLinkToken(token) };
}

/**
 * SHA-256 is enough here (no salt, no scrypt): the token is 256 random bits, so a leaked table
 * cannot be reversed by guessing, and a lookup by hash stays a plain indexed query.
 */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** How long each kind of link stays valid. */
export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;
export const PASSWORD_RESET_TTL_MS = 60 * 60 * 1000;
