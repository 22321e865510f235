import nodemailer, { type Transporter } from 'nodemailer';
import { serverEnv } from './env';

/** SMTP settings from the environment (the local fake server in development and tests). */
export function smtpServerConfig() {
	const e = serverEnv();
	const secure = e.SMTP_SECURE === '1';
	return {
		host: e.SMTP_HOST,
		port: e.SMTP_PORT,
		secure,
		ignoreTLS: !secure && e.KAPPALINE_DEV_MAIL === '1',
		auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASSWORD ?? '' } : undefined,
		// Bounded waits: an unreachable mail server fails the send in seconds (the invitation stays
		// stored, marked unsent) instead of holding the request for nodemailer's default minutes.
		connectionTimeout: 10_000,
		greetingTimeout: 10_000,
		socketTimeout: 20_000
	};
}

let transport: Transporter | undefined;

export async function sendMail(to: string, subject: string, text: string): Promise<void> {
	transport ??= nodemailer.createTransport(smtpServerConfig());
	await transport.sendMail({ from: serverEnv().MAIL_FROM, to, subject, text });
}
