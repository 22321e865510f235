/**
 * The tuning objective for given J terms (science notes, section 3), in eV (or eV^2 for 'square-sum'):
 *   'abs-sum'      |J_IP| + |J_EA|          (default)
 *   'square-sum'   J_IP^2 + J_EA^2
 *   'ip-only'      |J_IP|                   (anion unbound)
 *   'lumo-variant' |J_IP| + |eps_LUMO(N) + EA|
 * Returns null when a term the objective needs is missing.
 */
import { TuningInputError } from './tuning-input-error';
import { TUNING_OBJECTIVES, type TuningObjective } from './types';

export interface ObjectiveTermsEv {
	jIpEv: number | null;
	jEaEv?: number | null;
	jEaLumoEv?: number | null;
}

export interface ObjectiveValueOptions {
	objective?: TuningObjective;
}

/** Which J terms an objective needs. */
export function objectiveNeeds(objective: TuningObjective): { ip: true; ea: 'jEa' | 'jEaLumo' | null } {
	switch (objective) {
		case 'abs-sum':
		case 'square-sum':
			return { ip: true, ea: 'jEa' };
		case 'lumo-variant':
			return { ip: true, ea: 'jEaLumo' };
		case 'ip-only':
			return { ip: true, ea: null };
	}
}

/** Unit of the objective's value. */
export const objectiveUnit = (objective: TuningObjective): 'eV' | 'eV^2' => (objective === 'square-sum' ? 'eV^2' : 'eV');

export function checkedObjective(objective: unknown): TuningObjective {
	if (objective === undefined) return 'abs-sum';
	if (typeof objective !== 'string' || !(TUNING_OBJECTIVES as readonly string[]).includes(objective))
		throw new TuningInputError(
			`objective must be one of ${TUNING_OBJECTIVES.join(', ')}, got ${String(objective)}`,
			'objective'
		);
	return objective as TuningObjective;
}

export function objectiveValue(terms: ObjectiveTermsEv, options: ObjectiveValueOptions = {}): number | null {
	const objective = checkedObjective(options.objective);
	const ip = terms.jIpEv;
	const ea = objectiveNeeds(objective).ea === 'jEaLumo' ? terms.jEaLumoEv : terms.jEaEv;
	for (const [name, v] of [['jIpEv', ip], ['jEaEv', terms.jEaEv], ['jEaLumoEv', terms.jEaLumoEv]] as const)
		if (v !== null && v !== undefined && !Number.isFinite(v))
			throw new TuningInputError(`${name} must be a finite number or null, got ${v}`, name);
	if (ip === null || ip === undefined) return null;
	if (objective === 'ip-only') return Math.abs(ip);
	if (ea === null || ea === undefined) return null;
	return objective === 'square-sum' ? ip * ip + ea * ea : Math.abs(ip) + Math.abs(ea);
}
