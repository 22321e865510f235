import { env as dyn } from '$env/dynamic/private';
import { z } from 'zod';

const schema = z.object({
	DATABASE_URL: z.string().min(1, 'DATABASE_URL is required (npm start sets it)'),
	AUTH_SECRET: z.string().min(16, 'AUTH_SECRET must be at least 16 characters'),
	ORIGIN: z.string().url().optional(),
	PUBLIC_ORIGIN: z.string().url().optional(),
	SMTP_HOST: z.string().default('127.0.0.1'),
	SMTP_PORT: z.coerce.number().int().positive().default(2525),
	SMTP_USER: z.string().optional(),
	SMTP_PASSWORD: z.string().optional(),
	SMTP_SECURE: z.enum(['0', '1']).default('0'),
	MAIL_FROM: z.string().default('Kappaline <no-reply@kappaline.invalid>'),
	MAIL_DIR: z.string().optional(),
	KAPPALINE_DEV_MAIL: z.enum(['0', '1']).default('0'),
	KAPPALINE_TEST: z.enum(['0', '1']).default('0')
});

export type ServerEnv = z.infer<typeof schema>;
let parsed: ServerEnv | undefined;

/** Server settings, parsed once and failing fast with the offending variable named. */
export function serverEnv(): ServerEnv {
	if (parsed) return parsed;
	const r = schema.safeParse(dyn);
	if (!r.success) {
		const issues = r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
		throw new Error(`invalid server environment: ${issues}`);
	}
	parsed = r.data;
	return parsed;
}

export function publicOrigin(): string {
	const e = serverEnv();
	return e.PUBLIC_ORIGIN ?? e.ORIGIN ?? 'http://127.0.0.1:5173';
}
