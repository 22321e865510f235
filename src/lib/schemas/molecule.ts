import { z } from 'zod';

/** Largest geometry text accepted, in bytes (XYZ upload or paste). */
export const MAX_GEOMETRY_BYTES = 1_000_000;

const optionalText = (max: number) =>
	z
		.string()
		.max(max, `at most ${max} characters`)
		.optional()
		.transform((s) => (s ?? '').trim());

export const moleculeInput = z.object({
	name: z.string().trim().min(1, 'a name is required').max(200, 'at most 200 characters'),
	formula: optionalText(200),
	netCharge: z.coerce.number().int('net charge must be a whole number').min(-10).max(10).default(0),
	multiplicity: z.coerce.number().int('multiplicity must be a whole number').min(1, 'multiplicity is at least 1').max(11).default(1),
	geometryXyz: z
		.string()
		.min(1, 'a geometry (XYZ) is required')
		.refine((s) => new TextEncoder().encode(s).length <= MAX_GEOMETRY_BYTES, {
			message: `the geometry is larger than the limit of ${MAX_GEOMETRY_BYTES / 1_000_000} MB`
		}),
	smiles: optionalText(2000),
	notes: optionalText(20_000)
});
export type MoleculeInput = z.infer<typeof moleculeInput>;

export const moleculePatch = moleculeInput.partial();
export type MoleculePatch = z.infer<typeof moleculePatch>;
