import { mkdirSync, readFileSync, writeFileSync, chmodSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { planBundle } from '$lib/formats/bundle';
import { parseXyz, XyzParseError } from '$lib/formats/xyz';
import pkg from '../../../package.json' with { type: 'json' };
import { requiredNumber } from '../args';
import { CliInputError, CliUsageError, type CliCommand } from '../types';

const usage = 'kappaline deck nwchem --xyz FILE --charge Q --mult M --alpha A --gamma G [--epsilon E] [--basis NAME] [--scan FROM:TO:STEP] --out DIR';

/** The same files as the web bundle (decks, scripts, README, manifest.json), written to a folder. */
export const command: CliCommand = {
	name: 'deck',
	summary: 'write NWChem decks (tuning scan or screened rerun) with run scripts and a manifest, as the web bundle',
	usage,
	async run(args, io) {
		let parsed;
		try {
			parsed = parseArgs({ args, allowPositionals: true, options: { xyz: { type: 'string' }, charge: { type: 'string', default: '0' }, mult: { type: 'string', default: '1' }, alpha: { type: 'string' }, gamma: { type: 'string' }, epsilon: { type: 'string' }, basis: { type: 'string', default: 'aug-cc-pvdz' }, scan: { type: 'string' }, out: { type: 'string' }, name: { type: 'string' } } });
		} catch (e) {
			throw new CliUsageError((e as Error).message);
		}
		const { values, positionals } = parsed;
		if (positionals[0] !== 'nwchem') throw new CliUsageError('the engine is the first argument; only nwchem is supported');
		if (!values.xyz || !values.out) throw new CliUsageError('--xyz and --out are required');
		let atoms;
		try {
			atoms = parseXyz(readFileSync(resolve(io.cwd, values.xyz))).atoms.map((a) => ({ element: a.element, x: a.x, y: a.y, z: a.z }));
		} catch (e) {
			if (e instanceof XyzParseError) throw new CliInputError(`${values.xyz}: ${e.message}`);
			throw new CliInputError(`${values.xyz}: ${(e as Error).message}`);
		}
		const alpha = requiredNumber('alpha', values.alpha);
		const gamma = requiredNumber('gamma', values.gamma);
		let tuning = null;
		let screened = null;
		if (values.scan !== undefined) {
			const parts = values.scan.split(':').map(Number);
			if (parts.length !== 3 || parts.some((x) => !Number.isFinite(x)) || !(parts[2] > 0) || parts[1] < parts[0]) throw new CliInputError('--scan is FROM:TO:STEP with STEP > 0 and TO >= FROM, e.g. 0.1:0.5:0.05');
			const n = Math.floor((parts[1] - parts[0]) / parts[2] + 1e-9) + 1;
			if (n > 200) throw new CliInputError(`--scan gives ${n} gamma values; at most 200`);
			tuning = { gammasBohrInv: Array.from({ length: n }, (_, i) => Number((parts[0] + i * parts[2]).toPrecision(12))), layout: 'per-state' as const };
		} else {
			if (values.epsilon === undefined) throw new CliUsageError('give --scan FROM:TO:STEP for a tuning scan, or --epsilon E for a screened rerun');
			screened = { gammaBohrInv: gamma, epsilons: [requiredNumber('epsilon', values.epsilon)] };
		}
		let plan;
		try {
			plan = await planBundle({
				engine: 'nwchem',
				molecule: { name: values.name ?? values.xyz.replace(/^.*\//, '').replace(/\.xyz$/i, ''), atoms, charge: requiredNumber('charge', values.charge), multiplicity: requiredNumber('mult', values.mult) },
				alpha,
				tuning,
				screened,
				settings: { basis: values.basis },
				appVersion: pkg.version,
				createdAt: new Date().toISOString(),
				rootFolder: ''
			});
		} catch (e) {
			throw new CliInputError((e as Error).message);
		}
		const out = resolve(io.cwd, values.out);
		for (const f of plan.files) {
			const path = join(out, f.path);
			mkdirSync(dirname(path), { recursive: true });
			writeFileSync(path, f.text);
			if (f.executable) chmodSync(path, 0o755);
		}
		io.stdout.write(`wrote ${plan.files.length} files to ${out} (${plan.files.filter((f) => f.deck).length} decks); run ./run-local.sh there or submit-slurm.sh\n`);
		return 0;
	}
};
