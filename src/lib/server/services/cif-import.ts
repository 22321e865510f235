// A polymorph from a CIF file (one transaction: polymorph, stored CIF, activity), or a polymorph's cell
// replaced from a CIF. The file is read by src/lib/formats/cif.ts; nothing is stored when it is refused.
import { CifParseError, polymorphFromCif, type CifPolymorph } from '$lib/formats/cif';
import { formulaHill, parseFormula } from '$lib/science/elements';
import type { CifImportInput, CifReplaceInput } from '$lib/schemas/dielectric';
import { polymorphInput } from '$lib/schemas/polymorph';
import type { Executor } from '../db';
import { NotFoundError, StaleVersionError, ValidationError } from '../errors';
import { logActivity } from '../repo/activity';
import type { Actor } from './actor';
import { cellColumns, toPolymorph, type Polymorph } from './polymorphs';
import { inTransaction } from '../db/transaction';

export interface StoredCif {
	fileName: string;
	blockName: string;
	atomSiteCount: number;
	uploadedAt: Date;
	uploadedBy: string | null;
}

export interface CifImportResult {
	polymorph: Polymorph;
	warnings: string[];
}

/** Reads the CIF and turns its findings into the polymorph's fields; errors name the line. */
function readCif(text: string, fileName: string): { parsed: CifPolymorph; fields: ReturnType<typeof polymorphInput.parse> } {
	let parsed: CifPolymorph;
	try {
		parsed = polymorphFromCif(text);
	} catch (e) {
		if (e instanceof CifParseError) throw new ValidationError(`${e.message}${fileName ? ` (in ${fileName})` : ''}`, 'cif', e.line || undefined);
		throw e;
	}
	if (parsed.z === undefined) {
		throw new ValidationError(`${fileName || 'CIF'}: the file has no _cell_formula_units_Z, so the volume per molecule V/Z is unknown; add the tag (molecules per cell) and upload again`, 'cif');
	}
	const sg = [parsed.spaceGroup.hermannMauguin, parsed.spaceGroup.number ? `(No. ${parsed.spaceGroup.number})` : ''].filter(Boolean).join(' ');
	const r = polymorphInput.safeParse({
		label: parsed.blockName,
		spaceGroup: sg.slice(0, 60),
		a: parsed.cell.a.value,
		b: parsed.cell.b.value,
		c: parsed.cell.c.value,
		alphaDeg: parsed.cell.alphaDeg.value,
		betaDeg: parsed.cell.betaDeg.value,
		gammaDeg: parsed.cell.gammaDeg.value,
		z: parsed.z,
		temperatureK: parsed.temperatureK?.value,
		structureSource: `CIF ${fileName || 'upload'}, data block ${parsed.blockName}`.slice(0, 500),
		notes: ''
	});
	if (!r.success) {
		const issue = r.error.issues[0];
		throw new ValidationError(`${fileName || 'CIF'}: ${String(issue.path[0] ?? '')} ${issue.message}`.trim(), 'cif');
	}
	return { parsed, fields: r.data };
}

function formulaWarning(parsed: CifPolymorph, moleculeFormula: string): string[] {
	if (!parsed.formula || !moleculeFormula) return [];
	try {
		const mol = formulaHill(parseFormula(moleculeFormula));
		if (mol !== parsed.formula.hill) {
			return [
				`the CIF's formula ${parsed.formula.hill} differs from the molecule's ${mol}: density uses the molecule's formula and Z; check that Z counts molecules (not asymmetric units or ions)`
			];
		}
	} catch {
		/* the molecule's own formula is checked elsewhere */
	}
	return [];
}

function snapshot(p: Polymorph) {
	return { label: p.label, spaceGroup: p.spaceGroup, ...p.cell, z: p.z, temperatureK: p.temperatureK, structureSource: p.structureSource };
}

/** Creates a polymorph of a molecule from a CIF, storing the file with it. All or nothing. */
export async function importPolymorphFromCif(db: Executor, actor: Actor, input: CifImportInput): Promise<CifImportResult> {
	const { parsed, fields } = readCif(input.cif, input.fileName);
	const label = input.label || fields.label;
	return inTransaction(db, async (tx) => {
		const m = await tx.selectFrom('molecule').select(['formula', 'name']).where('workspace_id', '=', actor.workspaceId).where('id', '=', input.moleculeId).executeTakeFirst();
		if (!m) throw new NotFoundError('molecule');
		const r = await tx
			.insertInto('polymorph')
			.values({
				workspace_id: actor.workspaceId,
				molecule_id: input.moleculeId,
				label,
				...cellColumns(fields),
				notes: input.notes,
				created_by: actor.userId,
				updated_by: actor.userId
			})
			.returningAll()
			.executeTakeFirstOrThrow();
		await tx
			.insertInto('polymorph_cif')
			.values({
				polymorph_id: r.id,
				workspace_id: actor.workspaceId,
				file_name: input.fileName || `${parsed.blockName}.cif`,
				cif_text: input.cif,
				block_name: parsed.blockName,
				atom_site_count: parsed.atomSites.length,
				uploaded_by: actor.userId
			})
			.execute();
		const p = toPolymorph(r, m.formula);
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'polymorph',
			entityId: p.id,
			action: 'cif_import',
			summary: `imported polymorph ${p.label} of ${m.name} from ${input.fileName || 'a CIF'} (${parsed.atomSites.length} atom sites)`,
			after: snapshot(p)
		});
		return { polymorph: p, warnings: [...parsed.warnings, ...formulaWarning(parsed, m.formula)] };
	});
}

/** Replaces a polymorph's cell, space group, Z and temperature from a CIF and stores the file. */
export async function replaceCellFromCif(db: Executor, actor: Actor, polymorphId: string, expectedVersion: number, input: CifReplaceInput): Promise<CifImportResult> {
	const { parsed, fields } = readCif(input.cif, input.fileName);
	return inTransaction(db, async (tx) => {
		const current = await tx.selectFrom('polymorph').selectAll().where('workspace_id', '=', actor.workspaceId).where('id', '=', polymorphId).forUpdate().executeTakeFirst();
		if (!current) throw new NotFoundError('polymorph');
		if (current.version !== expectedVersion) throw new StaleVersionError('polymorph');
		const m = await tx.selectFrom('molecule').select(['formula', 'name']).where('id', '=', current.molecule_id).executeTakeFirstOrThrow();
		const r = await tx
			.updateTable('polymorph')
			.set({
				...cellColumns(fields),
				version: current.version + 1,
				updated_at: new Date(),
				updated_by: actor.userId
			})
			.where('id', '=', polymorphId)
			.returningAll()
			.executeTakeFirstOrThrow();
		const row = {
			workspace_id: actor.workspaceId,
			file_name: input.fileName || `${parsed.blockName}.cif`,
			cif_text: input.cif,
			block_name: parsed.blockName,
			atom_site_count: parsed.atomSites.length,
			uploaded_by: actor.userId,
			uploaded_at: new Date()
		};
		await tx
			.insertInto('polymorph_cif')
			.values({ polymorph_id: polymorphId, ...row })
			.onConflict((oc) => oc.column('polymorph_id').doUpdateSet(row))
			.execute();
		const before = toPolymorph(current, m.formula);
		const after = toPolymorph(r, m.formula);
		await logActivity(tx, {
			workspaceId: actor.workspaceId,
			actorId: actor.userId,
			entityType: 'polymorph',
			entityId: polymorphId,
			action: 'cif_replace',
			summary: `replaced the cell of ${after.label} from ${row.file_name}`,
			before: snapshot(before),
			after: snapshot(after)
		});
		return { polymorph: after, warnings: [...parsed.warnings, ...formulaWarning(parsed, m.formula)] };
	});
}

export async function getStoredCif(db: Executor, workspaceId: string, polymorphId: string): Promise<(StoredCif & { text: string; notes: string[] }) | null> {
	const r = await db
		.selectFrom('polymorph_cif as c')
		.innerJoin('polymorph as p', 'p.id', 'c.polymorph_id')
		.innerJoin('molecule as m', 'm.id', 'p.molecule_id')
		.leftJoin('User as u', 'u.id', 'c.uploaded_by')
		.selectAll('c')
		.select(['u.email', 'u.name', 'm.formula'])
		.where('c.workspace_id', '=', workspaceId)
		.where('c.polymorph_id', '=', polymorphId)
		.executeTakeFirst();
	if (!r) return null;
	// Findings of the reader (printed values that disagree, skipped sites) and a formula mismatch, re-read
	// from the stored file so they stay visible after the import.
	let notes: string[] = [];
	try {
		const parsed = polymorphFromCif(r.cif_text);
		notes = [...parsed.warnings, ...formulaWarning(parsed, r.formula)];
	} catch (e) {
		notes = [`the stored file no longer reads: ${(e as Error).message}`];
	}
	return { fileName: r.file_name, blockName: r.block_name, atomSiteCount: r.atom_site_count, uploadedAt: r.uploaded_at, uploadedBy: r.name || r.email, text: r.cif_text, notes };
}
