import { parseArgs } from 'node:util';
import { CAUTIONS, epsilonSweep, solidStateEstimate, type SolidStateEstimate } from '$lib/science/screening';
import { requiredNumber } from '../args';
import { CliUsageError, type CliCommand } from '../types';

const usage =
	'kappaline levels --alpha A --gamma G (--epsilon E | --epsilon-range FROM:TO:STEP) --ip IP_EV --ea EA_EV ' +
	'[--radius A | --volume-per-molecule A3] [--substrate-epsilon ES|metal --distance Z] [--json]';

const pick = (e: SolidStateEstimate, epsilon: number) => ({
	epsilon,
	alpha: e.alpha,
	beta: e.beta,
	gammaBohrInv: e.gammaBohrInv,
	longRangeFraction: e.longRangeFraction,
	radiusA: e.radiusA,
	pPlusEv: e.pPlusEv,
	pMinusEv: e.pMinusEv,
	ipSolidEv: e.ipSolidEv,
	eaSolidEv: e.eaSolidEv,
	gapSolidEv: e.gapSolidEv,
	renormalizationEv: e.renormalizationEv
});

export const command: CliCommand = {
	name: 'levels',
	summary: 'screened SRSH parameters and polarization-shifted IP/EA/gap for one epsilon or a sweep',
	usage,
	async run(args, io) {
		let values;
		try {
			({ values } = parseArgs({
				args,
				options: {
					alpha: { type: 'string' },
					gamma: { type: 'string' },
					epsilon: { type: 'string' },
					'epsilon-range': { type: 'string' },
					ip: { type: 'string' },
					ea: { type: 'string' },
					radius: { type: 'string' },
					'volume-per-molecule': { type: 'string' },
					'substrate-epsilon': { type: 'string' },
					distance: { type: 'string' },
					json: { type: 'boolean', default: false }
				}
			}));
		} catch (e) {
			throw new CliUsageError((e as Error).message);
		}
		const alpha = requiredNumber('alpha', values.alpha);
		const gamma = requiredNumber('gamma', values.gamma);
		const ip = requiredNumber('ip', values.ip);
		const ea = requiredNumber('ea', values.ea);
		if ((values.radius === undefined) === (values['volume-per-molecule'] === undefined))
			throw new CliUsageError('give exactly one of --radius (Å) or --volume-per-molecule (Å^3)');
		const cavity = values.radius !== undefined ? { radiusA: requiredNumber('radius', values.radius) } : { volumePerMoleculeA3: requiredNumber('volume-per-molecule', values['volume-per-molecule']) };
		let substrate: { distanceA: number; epsilon: number | 'metal' } | null = null;
		if (values['substrate-epsilon'] !== undefined || values.distance !== undefined) {
			if (values['substrate-epsilon'] === undefined || values.distance === undefined) throw new CliUsageError('--substrate-epsilon and --distance go together');
			const es = values['substrate-epsilon'] === 'metal' ? ('metal' as const) : requiredNumber('substrate-epsilon', values['substrate-epsilon']);
			substrate = { distanceA: requiredNumber('distance', values.distance), epsilon: es };
		}
		if ((values.epsilon === undefined) === (values['epsilon-range'] === undefined)) throw new CliUsageError('give exactly one of --epsilon or --epsilon-range FROM:TO:STEP');

		let epsilons: number[];
		if (values['epsilon-range'] !== undefined) {
			const parts = values['epsilon-range'].split(':');
			if (parts.length !== 3) throw new CliUsageError('--epsilon-range is FROM:TO:STEP, e.g. 1:5:0.5');
			const [from, to, step] = parts.map((p, i) => requiredNumber(['epsilon-range FROM', 'epsilon-range TO', 'epsilon-range STEP'][i], p));
			// The sweep routine validates the grid (step > 0, TO >= FROM, row limit) with specific messages.
			epsilons = epsilonSweep({ alpha, ipGasEv: ip, eaGasEv: ea, radiusA: 1, epsilons: { from, to, step } }).rows.map((r) => r.epsilon);
		} else {
			epsilons = [requiredNumber('epsilon', values.epsilon)];
		}
		const rows = epsilons.map((epsilon) => pick(solidStateEstimate({ alpha, gammaBohrInv: gamma, ipGasEv: ip, eaGasEv: ea, epsilon, cavity, substrate }), epsilon));

		if (values.json) {
			io.stdout.write(JSON.stringify(values['epsilon-range'] !== undefined ? rows : rows[0], null, 2) + '\n');
			return 0;
		}
		const f = (x: number, d = 3) => x.toFixed(d).padStart(8);
		const lines = [
			`gas phase: IP ${ip.toFixed(3)} eV, EA ${ea.toFixed(3)} eV, gap ${(ip - ea).toFixed(3)} eV; alpha ${alpha}, gamma ${gamma} bohr^-1; cavity radius ${rows[0].radiusA.toFixed(3)} Å`,
			'',
			' epsilon     beta   1/eps    P+ (eV)  IP_s (eV)  EA_s (eV) gap_s (eV)  shrink (eV)',
			...rows.map((r) => `${f(r.epsilon)} ${f(r.beta, 4)} ${f(r.longRangeFraction, 4)} ${f(r.pPlusEv)} ${f(r.ipSolidEv)}  ${f(r.eaSolidEv)}  ${f(r.gapSolidEv)}  ${f(r.renormalizationEv)}`),
			'',
			`Caution: ${CAUTIONS}`
		];
		io.stdout.write(lines.join('\n') + '\n');
		return 0;
	}
};
