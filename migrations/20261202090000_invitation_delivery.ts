import type { Kysely } from 'kysely';

// Delivery record of invitation e-mails: how many sends were tried, when the last one was, and the
// error it gave (null after a success), so owners see unsent invitations and can send them again.
export async function up(db: Kysely<any>): Promise<void> {
	await db.schema
		.alterTable('invitation')
		.addColumn('send_attempts', 'integer', (c) => c.notNull().defaultTo(0))
		.addColumn('last_attempt_at', 'timestamptz')
		.addColumn('last_send_error', 'text')
		.execute();
}

export async function down(db: Kysely<any>): Promise<void> {
	await db.schema.alterTable('invitation').dropColumn('send_attempts').dropColumn('last_attempt_at').dropColumn('last_send_error').execute();
}
