import { createHash, randomBytes } from 'node:crypto';

/** A random single-use token for links (invitations, password resets); only its hash is stored. */
export function newToken(): { token: string; hash: string } {
	const token = randomBytes(32).toString('base64url');
	return { token, hash: hashToken(token) };
}

export const hashToken = (token: string): string => createHash('sha256').update(token).digest('hex');
