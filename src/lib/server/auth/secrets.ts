/** Random tokens for links and API access; only their SHA-256 is stored. */
import { createHash, randomBytes } from 'node:crypto';

export const newToken = (prefix = '') => prefix + randomBytes(24).toString('base64url');
export const sha256 = (value: string) => createHash('sha256').update(value).digest('hex');
