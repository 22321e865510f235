// Web security basics against the built server: headers, SvelteKit's CSRF origin check, session cookie flags.
import { describe, expect, it } from 'vitest';
import { probe, requireEnv } from './http-helpers';

describe('web security', () => {
	it('pages carry a Content-Security-Policy and the usual hardening headers', async () => {
		const r = await fetch(`${requireEnv('APP_URL')}/signin`);
		const csp = r.headers.get('content-security-policy') ?? '';
		expect(csp).toMatch(/default-src 'self'/);
		expect(csp).toMatch(/frame-ancestors 'none'/);
		expect(csp).toMatch(/object-src 'none'/);
		expect(csp).toMatch(/script-src 'self' 'unsafe-eval' 'nonce-/);
		expect(r.headers.get('x-content-type-options')).toBe('nosniff');
		expect(r.headers.get('x-frame-options')).toBe('DENY');
		expect(r.headers.get('referrer-policy')).toBe('same-origin');
	});

	it('a form post from another origin is refused (CSRF origin check left on)', async () => {
		const r = await fetch(`${requireEnv('APP_URL')}/signup`, {
			method: 'POST',
			headers: { origin: 'http://evil.invalid', 'content-type': 'application/x-www-form-urlencoded' },
			body: 'email=a%40b.test&password=xxxxxxxxxxxx',
			redirect: 'manual'
		});
		expect(r.status).toBe(403);
	});

	it('the session cookie is HttpOnly and SameSite=Lax', async () => {
		const base = requireEnv('APP_URL');
		const email = `cookie-${Date.now()}@example.test`;
		const signup = await fetch(`${base}/signup`, {
			method: 'POST',
			headers: { origin: base, 'content-type': 'application/x-www-form-urlencoded' },
			body: new URLSearchParams({ name: 'C', email, password: 'cookie-password-1' }),
			redirect: 'manual'
		});
		const session = signup.headers.getSetCookie().find((c) => c.includes('session-token='));
		expect(session, `set-cookie: ${signup.headers.getSetCookie().join(' | ')}`).toBeTruthy();
		expect(session).toMatch(/HttpOnly/i);
		expect(session).toMatch(/SameSite=Lax/i);
	});

	it('sign-in attempts are rate limited per e-mail address', async () => {
		const attempt = async () =>
			(await probe('/signin?/password', { method: 'POST', action: true, body: new URLSearchParams({ email: 'nobody-rate@example.test', password: 'wrong-password', redirectTo: '/' }) })).body;
		const first = await attempt();
		expect(first).toContain('Wrong e-mail or password.');
		let last = '';
		for (let i = 0; i < 10; i++) last = await attempt();
		expect(last).toContain('Too many sign-in attempts');
	});
});
