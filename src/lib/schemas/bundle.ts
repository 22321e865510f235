import { z } from 'zod';

const gamma = z.coerce.number({ error: 'gamma must be a number (bohr^-1)' }).gt(0, 'gamma must be > 0 bohr^-1').lt(10, 'gamma must be < 10 bohr^-1');

/** Engines a bundle can be made for; Psi4 inputs need Psi4 >= 1.4 to set omega (1.3.2 cannot). */
export const BUNDLE_ENGINE_CHOICES = ['nwchem', 'psi4'] as const;

/** What a user asks for when downloading a rerun bundle (NWChem decks or Psi4 inputs, scripts, manifest). */
export const bundleRequest = z
	.object({
		moleculeId: z.uuid('moleculeId must be a UUID'),
		engine: z
			.enum(BUNDLE_ENGINE_CHOICES, { error: 'engine must be nwchem or psi4' })
			.optional()
			.meta({ description: 'nwchem (default) or psi4; Psi4 inputs need Psi4 >= 1.4 (1.3.2 stops with "set_omega not implemented")' }),
		polymorphId: z.uuid().optional(),
		studyId: z.uuid().optional(),
		alpha: z.coerce.number({ error: 'alpha must be a number' }).min(0, 'alpha must be between 0 and 1').max(1, 'alpha must be between 0 and 1'),
		tuningGammas: z.array(gamma).max(60, 'at most 60 gamma values').optional(),
		/** One deck per state, or the three states in one deck per gamma. */
		tuningLayout: z.enum(['per-state', 'combined'], { error: 'layout must be per-state or combined' }).default('per-state'),
		screened: z
			.object({
				gammaBohrInv: gamma,
				epsilons: z.array(z.coerce.number().min(1, 'epsilon must be >= 1').max(100)).min(1, 'give at least one epsilon').max(50, 'at most 50 epsilon values'),
				epsilonSource: z.string().max(300).optional()
			})
			.optional(),
		basis: z.string().trim().min(1).max(80).default('aug-cc-pvdz'),
		memoryMb: z.coerce.number().int().min(100).max(1_000_000).default(2000),
		cores: z.coerce.number().int().min(1).max(1024).default(4)
	})
	.refine((r) => (r.tuningGammas?.length ?? 0) > 0 || !!r.screened, { message: 'ask for tuning decks (gamma values), screened reruns (epsilon values), or both', path: ['tuningGammas'] });
export type BundleRequest = z.infer<typeof bundleRequest>;

/** Parses "0.1, 0.2 0.3" or "0.1:0.5:0.05" into numbers. */
export function parseNumberList(text: string): number[] {
	const t = text.trim();
	if (!t) return [];
	const range = /^([\d.eE+-]+)\s*:\s*([\d.eE+-]+)\s*:\s*([\d.eE+-]+)$/.exec(t);
	if (range) {
		const [from, to, step] = range.slice(1).map(Number);
		if (!(step > 0) || !(to >= from)) throw new Error(`range ${t}: need FROM:TO:STEP with STEP > 0 and TO >= FROM`);
		const n = Math.floor((to - from) / step + 1e-9) + 1;
		if (n > 200) throw new Error(`range ${t} has ${n} values; at most 200`);
		return Array.from({ length: n }, (_, i) => Number((from + i * step).toPrecision(12)));
	}
	return t.split(/[\s,;]+/).map((s) => {
		const v = Number(s);
		if (!Number.isFinite(v)) throw new Error(`"${s}" is not a number`);
		return v;
	});
}

/** The bundle request from a page form (numbers as text, lists as "0.1, 0.2" or FROM:TO:STEP). */
export function bundleRequestFromForm(f: Record<string, string>): BundleRequest {
	const eps = f.epsilons ? parseNumberList(f.epsilons) : [];
	return bundleRequest.parse({
		moleculeId: f.moleculeId,
		engine: f.engine || undefined,
		polymorphId: f.polymorphId || undefined,
		studyId: f.studyId || undefined,
		alpha: f.alpha,
		tuningGammas: f.tuningGammas ? parseNumberList(f.tuningGammas) : undefined,
		tuningLayout: f.tuningLayout || undefined,
		screened: eps.length ? { gammaBohrInv: f.gamma, epsilons: eps, epsilonSource: f.epsilonSource || undefined } : undefined,
		basis: f.basis || undefined,
		memoryMb: f.memoryMb || undefined,
		cores: f.cores || undefined
	});
}
