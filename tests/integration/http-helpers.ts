// Helpers for integration tests that talk HTTP to the built server started by `npm test`.
export const APP_URL = process.env.APP_URL ?? '';

export function requireEnv(name: string): string {
	const v = process.env[name];
	if (!v) throw new Error(`${name} is not set: run the integration tests through npm test`);
	return v;
}

/** Signs in through Auth.js's credentials callback and returns the session cookie header. */
export async function signInCookie(email: string, password: string): Promise<string> {
	const base = requireEnv('APP_URL');
	const r = await fetch(`${base}/auth/callback/credentials`, {
		method: 'POST',
		redirect: 'manual',
		headers: { 'content-type': 'application/x-www-form-urlencoded', origin: base },
		body: new URLSearchParams({ email, password, callbackUrl: '/' })
	});
	const cookies = r.headers.getSetCookie().map((c) => c.split(';')[0]);
	const session = cookies.find((c) => c.includes('session-token='));
	if (!session) throw new Error(`sign-in failed for ${email} (status ${r.status}, location ${r.headers.get('location')})`);
	return cookies.join('; ');
}

export interface Probe {
	status: number;
	/** For form actions: the action result type SvelteKit reports in its JSON envelope. */
	type?: string;
	location?: string | null;
	body: string;
}

/** One request as a given user; form actions are posted the way SvelteKit's enhance does (JSON envelope). */
export async function probe(path: string, opts: { method?: string; cookie?: string; action?: boolean; body?: BodyInit; headers?: Record<string, string> } = {}): Promise<Probe> {
	const base = requireEnv('APP_URL');
	const headers: Record<string, string> = { origin: base, ...(opts.headers ?? {}) };
	if (opts.cookie) headers.cookie = opts.cookie;
	if (opts.action) headers.accept = 'application/json';
	const r = await fetch(`${base}${path}`, { method: opts.method ?? 'GET', headers, body: opts.body, redirect: 'manual' });
	const body = await r.text();
	let type: string | undefined;
	let status = r.status;
	if (opts.action && r.headers.get('content-type')?.includes('application/json')) {
		try {
			const j = JSON.parse(body);
			type = j.type;
			if (j.type === 'failure' || j.type === 'error') status = j.status ?? status;
			if (j.type === 'redirect') return { status: j.status ?? 303, type, location: j.location, body };
		} catch {
			/* not an envelope */
		}
	}
	return { status, type, location: r.headers.get('location'), body };
}
