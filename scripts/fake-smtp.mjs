// Local fake SMTP server for development and tests: accepts every message on loopback and
// writes it to MAIL_DIR as <time>-<id>.eml plus a small .json summary that the dev-only
// /dev/mail page and the end-to-end tests read. Never relays anything.
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';

const dir = process.env.MAIL_DIR ?? '.data/mail';
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	logger: false,
	size: 5 * 1024 * 1024,
	onData(stream, _session, callback) {
		const chunks = [];
		stream.on('data', (c) => chunks.push(c));
		stream.on('end', async () => {
			try {
				const raw = Buffer.concat(chunks);
				const parsed = await simpleParser(raw);
				const id = `${Date.now()}-${randomUUID().slice(0, 8)}`;
				writeFileSync(join(dir, `${id}.eml`), raw);
				const to = [parsed.to].flat().filter(Boolean).flatMap((a) => a.value.map((v) => v.address));
				writeFileSync(
					join(dir, `${id}.json`),
					JSON.stringify({ id, to, from: parsed.from?.text ?? '', subject: parsed.subject ?? '', date: new Date().toISOString(), text: parsed.text ?? '' }, null, 2)
				);
				callback();
			} catch (e) {
				callback(e);
			}
		});
	}
});

const port = Number(process.env.SMTP_PORT ?? 0);
server.listen(port, '127.0.0.1', () => {
	const actual = server.server.address().port;
	if (process.env.SMTP_PORT_FILE) writeFileSync(process.env.SMTP_PORT_FILE, String(actual));
	console.log(`[fake-smtp] listening on 127.0.0.1:${actual}, writing to ${dir}`);
});
const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
