// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	namespace App {
		interface Locals {
			user: { id: string; email: string; name: string | null } | null;
		}
		interface Error {
			message: string;
			id?: string;
		}
	}
}

export {};
