import { z } from 'zod';

/** The error body every /api/v1 route returns. */
export const apiErrorBody = z
	.object({
		error: z.object({
			type: z.string().meta({ description: 'stable machine-readable kind, e.g. validation, stale_version, not_found' }),
			message: z.string(),
			field: z.string().optional().meta({ description: 'the offending field, when there is one' }),
			line: z.number().int().optional().meta({ description: 'the offending line of an uploaded file' }),
			fields: z.record(z.string(), z.array(z.string())).optional(),
			dependents: z.array(z.string()).optional()
		})
	})
	.meta({ id: 'ApiError' });

export const workspaceSummary = z
	.object({ id: z.uuid(), name: z.string(), isDemo: z.boolean(), role: z.enum(['owner', 'editor', 'viewer']) })
	.meta({ id: 'WorkspaceSummary' });

export const moleculeOut = z
	.object({
		id: z.uuid(),
		workspaceId: z.uuid(),
		name: z.string(),
		formula: z.string(),
		netCharge: z.number().int(),
		multiplicity: z.number().int(),
		geometryXyz: z.string().optional().meta({ description: 'XYZ text, Å (omitted in lists)' }),
		atomCount: z.number().int(),
		smiles: z.string().nullable(),
		notes: z.string(),
		version: z.number().int().meta({ description: 'send it back in If-Match to update' }),
		createdAt: z.string(),
		updatedAt: z.string()
	})
	.meta({ id: 'Molecule' });

export const polymorphOut = z
	.object({
		id: z.uuid(),
		workspaceId: z.uuid(),
		moleculeId: z.uuid(),
		moleculeName: z.string().optional(),
		label: z.string(),
		spaceGroup: z.string(),
		cell: z.object({ a: z.number(), b: z.number(), c: z.number(), alphaDeg: z.number(), betaDeg: z.number(), gammaDeg: z.number() }).meta({ description: 'lengths in Å, angles in degrees' }),
		z: z.number().int(),
		temperatureK: z.number().nullable(),
		structureSource: z.string(),
		notes: z.string(),
		version: z.number().int(),
		derived: z.object({
			volumeA3: z.number(),
			volumePerMoleculeA3: z.number(),
			densityGPerCm3: z.number().nullable(),
			bornRadiusA: z.number()
		})
	})
	.meta({ id: 'Polymorph' });

export const listOf = <T extends z.ZodType>(item: T) =>
	z.object({ items: z.array(item), nextCursor: z.string().nullable().meta({ description: 'pass as ?cursor= for the next page; null on the last page' }) });
