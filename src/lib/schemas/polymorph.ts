import { z } from 'zod';

const length = (name: string) =>
	z.coerce.number({ error: `${name} must be a number` }).gt(0, `${name} must be > 0 Å`).lt(1000, `${name} must be < 1000 Å`);
const angle = (name: string) =>
	z.coerce.number({ error: `${name} must be a number` }).gt(0, `${name} must be > 0°`).lt(180, `${name} must be < 180°`);
const optionalText = (max: number) =>
	z
		.string()
		.max(max, `at most ${max} characters`)
		.optional()
		.transform((s) => (s ?? '').trim());

export const polymorphInput = z.object({
	label: z.string().trim().min(1, 'a label is required').max(200),
	spaceGroup: optionalText(60),
	a: length('a'),
	b: length('b'),
	c: length('c'),
	alphaDeg: angle('alpha'),
	betaDeg: angle('beta'),
	gammaDeg: angle('gamma'),
	z: z.coerce.number().int('Z must be a whole number').min(1, 'Z is at least 1').max(1000),
	temperatureK: z.preprocess(
		(v) => (v === '' || v === null || v === undefined ? undefined : v),
		z.coerce.number().gt(0, 'temperature must be > 0 K').lt(2000).optional()
	),
	structureSource: optionalText(500),
	notes: optionalText(20_000)
});
export type PolymorphInput = z.infer<typeof polymorphInput>;
export const polymorphPatch = polymorphInput.partial();
export type PolymorphPatch = z.infer<typeof polymorphPatch>;
