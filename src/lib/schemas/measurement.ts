import { z } from 'zod';

const optionalEv = (name: string) =>
	z.preprocess(
		(v) => (v === '' || v === null || v === undefined ? undefined : v),
		z.coerce.number({ error: `${name} must be a number (eV)` }).gt(0, `${name} must be > 0 eV`).lt(30, `${name} must be < 30 eV`).optional()
	);

export const measurementInput = z
	.object({
		ipEv: optionalEv('IP'),
		eaEv: z.preprocess(
			(v) => (v === '' || v === null || v === undefined ? undefined : v),
			z.coerce.number({ error: 'EA must be a number (eV)' }).gt(-5, 'EA must be > -5 eV').lt(15, 'EA must be < 15 eV').optional()
		),
		transportGapEv: optionalEv('transport gap'),
		opticalGapEv: optionalEv('optical gap'),
		uncertaintyEv: z.preprocess((v) => (v === '' || v == null ? undefined : v), z.coerce.number().gt(0, 'uncertainty must be > 0 eV').lt(5).optional()),
		method: z.string().trim().min(1, 'name the method, e.g. UPS, IPES, LEIPS, cyclic voltammetry').max(200),
		sampleNotes: z.string().max(5000).optional().transform((s) => (s ?? '').trim()),
		reference: z.string().max(1000).optional().transform((s) => (s ?? '').trim())
	})
	.refine((m) => m.ipEv !== undefined || m.eaEv !== undefined || m.transportGapEv !== undefined || m.opticalGapEv !== undefined, {
		message: 'enter at least one measured value (IP, EA, transport gap or optical gap)',
		path: ['ipEv']
	});
export type MeasurementInput = z.infer<typeof measurementInput>;
