import { z } from 'zod';

/** Largest CIF accepted from a form or the API, in bytes. */
export const MAX_CIF_BYTES = 2_000_000;
/** Largest tensor text accepted (paste or upload). */
export const MAX_TENSOR_BYTES = 20_000;

const optionalText = (max: number) =>
	z
		.string()
		.max(max, `at most ${max} characters`)
		.nullish()
		.transform((s) => (s ?? '').trim());

/** A number from a form field or JSON; '' and missing mean "not given". */
const optionalNumber = (name: string) =>
	z.preprocess(
		(v) => (v === '' || v === null || v === undefined ? undefined : v),
		z.coerce.number({ error: `${name} must be a number` }).refine(Number.isFinite, `${name} must be a finite number`).optional()
	);
const requiredNumber = (name: string) =>
	z.preprocess(
		(v) => (v === '' || v === null ? undefined : v),
		z.coerce.number({ error: `${name} is required and must be a number` }).refine(Number.isFinite, `${name} must be a finite number`)
	);

const bytes = (s: string) => new TextEncoder().encode(s).length;

export const FREQUENCIES = ['electronic', 'static'] as const;
export const POLARIZABILITY_UNITS = ['A3', 'bohr3', 'SI'] as const;
export const POLARIZABILITY_UNIT_LABELS: Record<(typeof POLARIZABILITY_UNITS)[number], string> = {
	A3: 'Å³ (polarizability volume)',
	bohr3: 'bohr³ (atomic units)',
	SI: 'C·m²/V (SI)'
};
export const TENSOR_SCALARS = ['trace/3', 'harmonic', 'geometric'] as const;

const source = {
	frequency: z.enum(FREQUENCIES, { error: 'choose electronic (high-frequency) or static' }).default('electronic'),
	method: optionalText(300),
	engine: optionalText(200),
	reference: optionalText(1000),
	note: optionalText(5000)
};

const tensorText = z
	.string({ error: 'paste or upload a tensor' })
	.min(1, 'paste or upload a tensor')
	.refine((s) => bytes(s) <= MAX_TENSOR_BYTES, { message: `the tensor text is larger than the limit of ${MAX_TENSOR_BYTES / 1000} kB` });

/** A 3x3 matrix sent as JSON, or its text in any accepted tensor format. */
const matrixOrText = z.union([z.array(z.array(z.number()).length(3)).length(3), tensorText]);

export const scalarEntryInput = z.object({
	kind: z.literal('scalar'),
	...source,
	epsilon: requiredNumber('epsilon').refine((v) => v > 0, 'epsilon must be > 0'),
	epsilonUncertainty: optionalNumber('uncertainty').refine((v) => v === undefined || v >= 0, 'the uncertainty must be >= 0')
});

export const tensorEntryInput = z.object({
	kind: z.literal('tensor'),
	...source,
	tensor: matrixOrText,
	scalar: z.enum(TENSOR_SCALARS, { error: 'scalar must be trace/3, harmonic or geometric' }).default('trace/3')
});

export const refractiveIndexEntryInput = z.object({
	kind: z.literal('refractive_index'),
	...source,
	frequency: z.literal('electronic', { error: 'a refractive index gives the electronic (high-frequency) constant' }).default('electronic'),
	refractiveIndex: requiredNumber('refractive index'),
	wavelengthNm: optionalNumber('wavelength'),
	refractiveIndexUncertainty: optionalNumber('uncertainty of n').refine((v) => v === undefined || v >= 0, 'the uncertainty must be >= 0')
});

export const clausiusMossottiEntryInput = z.object({
	kind: z.literal('clausius_mossotti'),
	...source,
	/** A number, a 3x3 matrix, or text (one number, or a tensor in any accepted format). */
	polarizability: z.union([z.number(), z.array(z.array(z.number()).length(3)).length(3), z.string().trim().min(1, 'give the polarizability')], {
		error: 'give the polarizability'
	}),
	unit: z.enum(POLARIZABILITY_UNITS, { error: 'unit must be A3 (Å³), bohr3 or SI (C·m²/V)' }),
	polarizabilityUncertainty: optionalNumber('uncertainty of the polarizability').refine((v) => v === undefined || v >= 0, 'the uncertainty must be >= 0')
});

export const dielectricEntryInput = z.discriminatedUnion('kind', [scalarEntryInput, tensorEntryInput, refractiveIndexEntryInput, clausiusMossottiEntryInput], {
	error: 'kind must be scalar, tensor, refractive_index or clausius_mossotti'
});
export type DielectricEntryInput = z.infer<typeof dielectricEntryInput>;

export const epsilonChoiceInput = z.object({
	entryId: z.uuid('choose an entry'),
	reason: z.string().trim().min(1, 'say why this value is the one to use').max(2000, 'at most 2000 characters'),
	/** Version of the current choice the caller read (0 or missing when there was none). */
	version: optionalNumber('version')
});
export type EpsilonChoiceInput = z.infer<typeof epsilonChoiceInput>;

const cifText = z
	.string({ error: 'the CIF text is required' })
	.min(1, 'the CIF file is empty')
	.refine((s) => bytes(s) <= MAX_CIF_BYTES, { message: `the CIF is larger than the limit of ${MAX_CIF_BYTES / 1_000_000} MB` });

export const cifImportInput = z.object({
	moleculeId: z.uuid('moleculeId must be a UUID'),
	/** Defaults to the data block name. */
	label: optionalText(200),
	fileName: optionalText(255),
	cif: cifText,
	notes: optionalText(20_000)
});
export type CifImportInput = z.infer<typeof cifImportInput>;

export const cifReplaceInput = z.object({
	fileName: optionalText(255),
	cif: cifText
});
export type CifReplaceInput = z.infer<typeof cifReplaceInput>;
