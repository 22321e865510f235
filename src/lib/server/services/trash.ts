import { sql, type Transaction } from 'kysely';
import type { Executor } from '../db';
import type { Database } from '../db/schema';
import type { TrashedRow, TrashRelink } from '../db/schema-trash';
import { inTransaction } from '../db/transaction';
import { DependentsError, NotFoundError, ValidationError } from '../errors';
import { logActivity, type ActivityInput } from '../repo/activity';
import type { Actor } from './actor';

/**
 * The trash. Deleting a record moves it here with every row its foreign keys would take with it
 * (ON DELETE CASCADE, followed down), read from PostgreSQL's catalog so a table added later is
 * covered without a change here; links that the delete clears (ON DELETE SET NULL) are noted and set
 * again on restore. Owners restore; nothing is lost without a trace.
 */

export type TrashEntity = 'molecule' | 'polymorph' | 'tuning study' | 'dielectric entry' | 'measurement' | 'rerun result';

interface ForeignKey {
	child: string;
	column: string;
	parent: string;
	parentColumn: string;
	/** pg_constraint.confdeltype: c cascade, n set null, d set default, r restrict, a no action. */
	action: string;
	columns: number;
}

/** Words for the rows that go with a record, by table. */
const NOUNS: Record<string, [string, string]> = {
	polymorph_cif: ['CIF file', 'CIF files'],
	dielectric_entry: ['dielectric entry', 'dielectric entries'],
	polymorph_epsilon: ['epsilon-in-use choice', 'epsilon-in-use choices'],
	measurement: ['measurement', 'measurements'],
	rerun_result: ['screened rerun result', 'screened rerun results'],
	solid_estimate: ['saved estimate', 'saved estimates'],
	scan_point: ['scan point', 'scan points'],
	tuning_idempotency_key: ['import receipt', 'import receipts'],
	bundle: ['bundle record', 'bundle records'],
	polymorph: ['polymorph', 'polymorphs'],
	tuning_study: ['tuning study', 'tuning studies']
};
const noun = (table: string, n: number) => `${n} ${(NOUNS[table] ?? [table, table])[n === 1 ? 0 : 1]}`;

type Tx = Transaction<Database>;

async function foreignKeys(tx: Tx): Promise<ForeignKey[]> {
	const r = await sql<ForeignKey>`
		select ch.relname as child, ca.attname as "column", pa_rel.relname as parent, pa.attname as "parentColumn",
		       c.confdeltype as action, array_length(c.conkey, 1) as columns
		from pg_constraint c
		join pg_class ch on ch.oid = c.conrelid
		join pg_class pa_rel on pa_rel.oid = c.confrelid
		join pg_attribute ca on ca.attrelid = c.conrelid and ca.attnum = c.conkey[1]
		join pg_attribute pa on pa.attrelid = c.confrelid and pa.attnum = c.confkey[1]
		where c.contype = 'f' and c.connamespace = 'public'::regnamespace`.execute(tx);
	return r.rows;
}

/** Single-column primary keys by table. */
async function primaryKeys(tx: Tx): Promise<Map<string, string>> {
	const r = await sql<{ t: string; col: string }>`
		select cl.relname as t, a.attname as col
		from pg_index i
		join pg_class cl on cl.oid = i.indrelid
		join pg_attribute a on a.attrelid = i.indrelid and a.attnum = i.indkey[0]
		where i.indisprimary and i.indnatts = 1 and cl.relnamespace = 'public'::regnamespace`.execute(tx);
	return new Map(r.rows.map((x) => [x.t, x.col]));
}

async function rowsWhere(tx: Tx, table: string, column: string, value: unknown): Promise<Record<string, unknown>[]> {
	const r = await sql<{ r: Record<string, unknown> }>`select to_jsonb(t) as r from ${sql.table(table)} as t where ${sql.ref(`t.${column}`)} = ${value}`.execute(tx);
	return r.rows.map((x) => x.r);
}

/** The rows a delete of `table`.`id` takes with it, and the links it clears. Refuses when a RESTRICT / NO ACTION key still points at it. */
async function collect(tx: Tx, table: string, id: string) {
	const fks = await foreignKeys(tx);
	const pks = await primaryKeys(tx);
	const rows: TrashedRow[] = [];
	const relinks: TrashRelink[] = [];
	const seen = new Set<string>();
	const visit = async (t: string, keyColumn: string, key: unknown, depth: number) => {
		if (depth > 6) throw new Error(`trash: foreign keys below ${table} nest deeper than expected`);
		for (const fk of fks.filter((f) => f.parent === t && f.parentColumn === keyColumn && f.columns === 1)) {
			if (fk.action === 'c') {
				for (const row of await rowsWhere(tx, fk.child, fk.column, key)) {
					const childKey = pks.get(fk.child);
					const tag = `${fk.child}:${childKey ? String(row[childKey]) : JSON.stringify(row)}`;
					if (seen.has(tag)) continue;
					seen.add(tag);
					rows.push({ table: fk.child, row });
					if (childKey) await visit(fk.child, childKey, row[childKey], depth + 1);
				}
			} else if (fk.action === 'n' || fk.action === 'd') {
				const childKey = pks.get(fk.child);
				if (!childKey) continue;
				const keys = (await rowsWhere(tx, fk.child, fk.column, key)).map((r) => r[childKey]);
				if (keys.length) relinks.push({ table: fk.child, column: fk.column, keyColumn: childKey, keys, value: key });
			} else {
				const n = (await rowsWhere(tx, fk.child, fk.column, key)).length;
				if (n) throw new DependentsError(`still referenced by ${noun(fk.child, n)}`, [noun(fk.child, n)]);
			}
		}
	};
	const root = await rowsWhere(tx, table, 'id', id);
	if (!root.length) throw new NotFoundError(table);
	rows.push({ table, row: root[0] });
	await visit(table, 'id', id, 0);
	return { rows, relinks, fks };
}

function describe(rows: TrashedRow[], relinks: TrashRelink[]): string {
	const counts = new Map<string, number>();
	for (const r of rows.slice(1)) counts.set(r.table, (counts.get(r.table) ?? 0) + 1);
	const parts = [...counts].map(([t, n]) => noun(t, n));
	for (const l of relinks) parts.push(`${noun(l.table, l.keys.length)} unlinked (linked again on restore)`);
	return parts.join(', ') || 'nothing else';
}

export interface TrashInput {
	entity: TrashEntity;
	table: 'molecule' | 'polymorph' | 'tuning_study' | 'dielectric_entry' | 'measurement' | 'rerun_result';
	id: string;
	label: string;
	parentHref: string | null;
}

/**
 * Moves a record and everything its delete would cascade to into the trash, then deletes it.
 * Runs inside the caller's transaction. Returns the trash entry's id and what went with the record.
 */
export async function moveToTrash(tx: Tx, actor: Actor, input: TrashInput): Promise<{ trashId: string; contents: string }> {
	const { rows, relinks } = await collect(tx, input.table, input.id);
	const contents = describe(rows, relinks);
	const r = await tx
		.insertInto('deleted_record')
		.values({
			workspace_id: actor.workspaceId,
			entity_type: input.entity,
			entity_id: input.id,
			root_table: input.table,
			label: input.label,
			contents,
			parent_href: input.parentHref,
			rows: JSON.stringify(rows),
			relinks: JSON.stringify(relinks),
			deleted_by: actor.userId
		})
		.returning('id')
		.executeTakeFirstOrThrow();
	await sql`delete from ${sql.table(input.table)} where id = ${input.id}`.execute(tx);
	return { trashId: r.id, contents };
}

/** Tables in an order that inserts every referenced row before the rows that reference it. */
function insertOrder(tables: string[], fks: ForeignKey[]): string[] {
	const left = new Set(tables);
	const out: string[] = [];
	while (left.size) {
		const ready = [...left].filter((t) => !fks.some((f) => f.child === t && f.parent !== t && left.has(f.parent)));
		if (!ready.length) throw new Error(`trash: circular foreign keys among ${[...left].join(', ')}`);
		for (const t of ready) {
			out.push(t);
			left.delete(t);
		}
	}
	return out;
}

async function insertRow(tx: Tx, table: string, row: Record<string, unknown>, columns: Set<string>) {
	// Columns the row had and the table still has; columns added since take their defaults.
	const cols = Object.keys(row).filter((c) => columns.has(c));
	const list = sql.join(cols.map((c) => sql.ref(c)));
	await sql`insert into ${sql.table(table)} (${list}) select ${list} from jsonb_populate_record(null::${sql.table(table)}, ${JSON.stringify(row)}::jsonb)`.execute(tx);
}

const ACTIVITY: Record<string, (row: Record<string, unknown>, id: string) => Pick<ActivityInput, 'entityType' | 'entityId'>> = {
	molecule: (_r, id) => ({ entityType: 'molecule', entityId: id }),
	polymorph: (_r, id) => ({ entityType: 'polymorph', entityId: id }),
	tuning_study: (_r, id) => ({ entityType: 'tuning_study', entityId: id })
};

/** Puts a trashed record back with everything that went with it (owners only; the route checks the role). */
export async function restoreFromTrash(db: Executor, actor: Actor, trashId: string): Promise<{ label: string; entity: string; notes: string[] }> {
	return inTransaction(db, async (tx) => {
		const t = await tx.selectFrom('deleted_record').selectAll().where('workspace_id', '=', actor.workspaceId).where('id', '=', trashId).forUpdate().executeTakeFirst();
		if (!t) throw new NotFoundError('deleted record');
		if (t.restored_at) throw new ValidationError(`${t.entity_type} ${t.label} was already restored`, 'id');
		const rows = t.rows as unknown as TrashedRow[];
		const relinks = t.relinks as unknown as TrashRelink[];
		const fks = await foreignKeys(tx);
		const notes: string[] = [];
		const root = rows[0].row;
		// The record's own parent (its molecule, its polymorph) must exist: name it when it is in the trash too.
		for (const fk of fks.filter((f) => f.child === t.root_table && f.columns === 1 && root[f.column] != null && f.parent !== 'workspace' && f.parent !== 'User')) {
			const exists = await rowsWhere(tx, fk.parent, fk.parentColumn, root[fk.column]);
			if (exists.length) continue;
			const parentTrash = await tx.selectFrom('deleted_record').select(['entity_type', 'label']).where('workspace_id', '=', actor.workspaceId).where('entity_id', '=', String(root[fk.column])).where('restored_at', 'is', null).executeTakeFirst();
			throw new ValidationError(
				parentTrash ? `${t.entity_type} ${t.label} belongs to ${parentTrash.entity_type} ${parentTrash.label}, which is in the trash: restore that first` : `${t.entity_type} ${t.label} belongs to a ${fk.parent.replace('_', ' ')} that no longer exists`,
				'id'
			);
		}
		// At most one current tuning study per molecule: a restored study stays non-current if another took over.
		for (const r of rows.filter((x) => x.table === 'tuning_study' && x.row.is_current)) {
			const other = await tx.selectFrom('tuning_study').select('name').where('molecule_id', '=', String(r.row.molecule_id)).where('is_current', '=', true).executeTakeFirst();
			if (other) {
				r.row.is_current = false;
				notes.push(`restored as not current: ${other.name} is the molecule's current study now`);
			}
		}
		const columns = new Map<string, Set<string>>();
		const cols = await sql<{ t: string; c: string }>`select table_name as t, column_name as c from information_schema.columns where table_schema = 'public'`.execute(tx);
		for (const { t: tb, c } of cols.rows) columns.set(tb, (columns.get(tb) ?? new Set()).add(c));
		const tables = [...new Set(rows.map((r) => r.table))];
		try {
			for (const table of insertOrder(tables, fks)) {
				if (!columns.has(table)) throw new ValidationError(`cannot restore: the table ${table} no longer exists`, 'id');
				for (const r of rows.filter((x) => x.table === table)) await insertRow(tx, table, r.row, columns.get(table)!);
			}
		} catch (e) {
			const code = (e as { code?: string }).code;
			if (code === '23505') throw new ValidationError(`cannot restore ${t.entity_type} ${t.label}: a record with the same key exists now (${(e as { detail?: string }).detail ?? 'duplicate'})`, 'id');
			if (code === '23503') throw new ValidationError(`cannot restore ${t.entity_type} ${t.label}: a record it refers to is gone (${(e as { detail?: string }).detail ?? 'missing reference'})`, 'id');
			throw e;
		}
		for (const l of relinks) {
			await sql`update ${sql.table(l.table)} set ${sql.ref(l.column)} = ${l.value} where ${sql.ref(l.keyColumn)} in (${sql.join(l.keys.map((k) => sql`${k}`))}) and ${sql.ref(l.column)} is null`.execute(tx);
		}
		await tx.updateTable('deleted_record').set({ restored_at: new Date(), restored_by: actor.userId }).where('id', '=', trashId).execute();
		const target = ACTIVITY[t.root_table]?.(root, t.entity_id) ?? { entityType: 'polymorph' as const, entityId: String(root.polymorph_id ?? t.entity_id) };
		await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.userId, ...target, action: 'restore', summary: `restored ${t.entity_type} ${t.label} from the trash (${t.contents})${notes.length ? `; ${notes.join('; ')}` : ''}` });
		return { label: t.label, entity: t.entity_type, notes };
	});
}

export interface TrashItem {
	id: string;
	entity: string;
	label: string;
	contents: string;
	parentHref: string | null;
	deletedAt: Date;
	deletedBy: string | null;
	restoredAt: Date | null;
	restoredBy: string | null;
}

export async function listTrash(db: Executor, workspaceId: string, limit = 200): Promise<TrashItem[]> {
	const rows = await db
		.selectFrom('deleted_record as d')
		.leftJoin('User as u', 'u.id', 'd.deleted_by')
		.leftJoin('User as r', 'r.id', 'd.restored_by')
		.select(['d.id', 'd.entity_type', 'd.label', 'd.contents', 'd.parent_href', 'd.deleted_at', 'd.restored_at', 'u.email as deleted_by', 'r.email as restored_by'])
		.where('d.workspace_id', '=', workspaceId)
		.orderBy('d.deleted_at', 'desc')
		.limit(limit)
		.execute();
	return rows.map((r) => ({ id: r.id, entity: r.entity_type, label: r.label, contents: r.contents, parentHref: r.parent_href, deletedAt: r.deleted_at, deletedBy: r.deleted_by, restoredAt: r.restored_at, restoredBy: r.restored_by }));
}
