import { hash, verify } from '@node-rs/argon2';

// Argon2id with the library's defaults (memory 19 MiB, 2 passes): OWASP's minimum recommendation.
export const hashPassword = (password: string): Promise<string> => hash(password);
export const verifyPassword = (stored: string, password: string): Promise<boolean> =>
	verify(stored, password).catch(() => false);
