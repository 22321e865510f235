import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { serverEnv } from './env';

export interface CapturedMail {
	id: string;
	to: string[];
	subject: string;
	date: string;
	text: string;
}

/** Messages captured by the local fake SMTP server (development and tests only). */
export function capturedMail(): CapturedMail[] | null {
	const e = serverEnv();
	if (e.KAPPALINE_DEV_MAIL !== '1' || !e.MAIL_DIR) return null;
	let files: string[];
	try {
		files = readdirSync(e.MAIL_DIR).filter((f) => f.endsWith('.json'));
	} catch {
		return [];
	}
	return files
		.sort()
		.reverse()
		.slice(0, 100)
		.map((f) => JSON.parse(readFileSync(join(e.MAIL_DIR!, f), 'utf8')) as CapturedMail);
}
