import { randomBytes, createHash } from 'node:crypto';

/** Short, URL-safe random ids for rows. */
export const newId = (bytes = 12) => randomBytes(bytes).toString('base64url');
/** A secret token (for links in e-mail) and the hash we store instead of it. */
export const newSecretToken = () => randomBytes(32).toString('base64url');
export const sha256 = (value: string) => createHash('sha256').update(value).digest('hex');
