import { CredentialsSignin, SvelteKitAuth } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { KyselyAdapter } from '@auth/kysely-adapter';
import { db } from './db';
import { serverEnv } from './env';
import { smtpServerConfig, sendMail } from './mail';
import { checkPassword, ensurePersonalWorkspace } from './services/accounts';
import { hitRateLimit } from './rate-limit';

/** Sign-in attempts allowed per e-mail address and per client address in a 15-minute window. */
export const SIGN_IN_LIMIT = { attempts: 10, windowSeconds: 15 * 60 };

export const { handle: authHandle, signIn, signOut } = SvelteKitAuth(async (event) => {
	const env = serverEnv();
	return {
		// The adapter is typed for its four tables; the app's schema is wider.
		// eslint-disable-next-line @typescript-eslint/no-explicit-any
		adapter: KyselyAdapter(db() as any),
		secret: env.AUTH_SECRET,
		trustHost: true,
		session: { strategy: 'jwt', maxAge: 7 * 24 * 3600 },
		pages: { signIn: '/signin', verifyRequest: '/signin/check-email', error: '/signin' },
		providers: [
			Credentials({
				id: 'credentials',
				credentials: { email: { type: 'email' }, password: { type: 'password' } },
				async authorize(c) {
					const email = String(c?.email ?? '').trim().toLowerCase();
					const password = String(c?.password ?? '');
					if (!email || !password) return null;
					const byEmail = await hitRateLimit(db(), `signin:email:${email}`, SIGN_IN_LIMIT.attempts, SIGN_IN_LIMIT.windowSeconds);
					const byAddr = await hitRateLimit(db(), `signin:addr:${event.getClientAddress()}`, SIGN_IN_LIMIT.attempts * 5, SIGN_IN_LIMIT.windowSeconds);
					if (!byEmail.allowed || !byAddr.allowed) throw new TooManyAttempts();
					const user = await checkPassword(db(), email, password);
					return user ? { id: user.id, email: user.email, name: user.name } : null;
				}
			}),
			Nodemailer({
				id: 'nodemailer',
				server: smtpServerConfig(),
				from: env.MAIL_FROM,
				maxAge: 30 * 60,
				async sendVerificationRequest({ identifier, url }) {
					const limit = await hitRateLimit(db(), `magic:${identifier}`, 5, 15 * 60);
					if (!limit.allowed) throw new Error('too many sign-in links requested for this address');
					await sendMail(
						identifier,
						'Your Kappaline sign-in link',
						`Sign in to Kappaline with this link (valid for 30 minutes, single use):\n\n${url}\n\nIf you did not ask for it, ignore this message.`
					);
				}
			})
		],
		callbacks: {
			jwt({ token, user }) {
				if (user?.id) token.sub = user.id;
				return token;
			},
			session({ session, token }) {
				if (token.sub && session.user) session.user.id = token.sub;
				return session;
			}
		},
		events: {
			async createUser({ user }) {
				if (user.id) await ensurePersonalWorkspace(db(), user.id, user.email ?? 'new user');
			}
		}
	};
});

/** Raised inside authorize when the rate limit is hit; surfaces as code 'rate_limited'. */
export class TooManyAttempts extends CredentialsSignin {
	code = 'rate_limited';
}

/** An event whose request carries the given form fields, for the Auth.js sign-in/out actions. */
export function withForm<E extends { request: Request }>(event: E, fields: Record<string, string>): E {
	const body = new FormData();
	for (const [k, v] of Object.entries(fields)) body.set(k, v);
	const headers = new Headers(event.request.headers);
	headers.delete('content-type'); // the FormData body sets its own multipart boundary
	headers.delete('content-length');
	return { ...event, request: new Request(event.request.url, { method: 'POST', headers, body }) };
}
