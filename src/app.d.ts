// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	namespace App {
		interface Locals {
			user: { id: string; email: string; name: string | null } | null;
			/** Set when the request authenticated with a personal API token (Authorization: Bearer). */
			token?: { id: string; workspaceId: string; role: 'owner' | 'editor' | 'viewer' };
			/** Set when the request failed because PostgreSQL was unreachable: the response becomes a 503. */
			databaseDown?: boolean;
		}
		interface Error {
			message: string;
			id?: string;
		}
	}
}

export {};
