import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { EngineOutputError, readEngineOutput } from '$lib/formats/decks';
import { CliInputError, CliUsageError, type CliCommand } from '../types';

/** One record per task of each output: what the web read-back stores, as JSON. */
export const command: CliCommand = {
	name: 'parse',
	summary: 'read NWChem or Psi4 outputs: energies, frontier and spin-resolved orbital energies, convergence',
	usage: 'kappaline parse OUTPUT_FILE... [--json]',
	async run(args, io) {
		let parsed;
		try {
			parsed = parseArgs({ args, allowPositionals: true, options: { json: { type: 'boolean', default: false } } });
		} catch (e) {
			throw new CliUsageError((e as Error).message);
		}
		if (!parsed.positionals.length) throw new CliUsageError('give at least one output file');
		const records = [];
		for (const file of parsed.positionals) {
			let out;
			try {
				out = readEngineOutput(readFileSync(resolve(io.cwd, file), 'utf8'));
			} catch (e) {
				if (e instanceof EngineOutputError) throw new CliInputError(`${file}${e.line ? ` line ${e.line}` : ''}: ${e.message}`);
				throw new CliInputError(`${file}: ${(e as Error).message}`);
			}
			for (const t of out.tasks)
				records.push({
					file,
					engine: out.engine,
					task: t.index,
					title: t.title,
					converged: t.converged,
					charge: t.charge,
					multiplicity: t.multiplicity,
					totalEnergyHa: t.totalEnergyHartree,
					homoHa: t.homoHartree,
					lumoHa: t.lumoHartree,
					alphaOrbitals: t.alphaOrbitals.map((o) => ({ index: o.index, occupation: o.occupation, energyHa: o.energyHartree })),
					betaOrbitals: t.betaOrbitals?.map((o) => ({ index: o.index, occupation: o.occupation, energyHa: o.energyHartree })) ?? null,
					errors: t.errors.map((e) => e.message)
				});
		}
		if (parsed.values.json) io.stdout.write(JSON.stringify(records, null, 2) + '\n');
		else
			for (const r of records)
				io.stdout.write(`${r.file} task ${r.task}: charge ${r.charge}, mult ${r.multiplicity}, E = ${r.totalEnergyHa} Ha, HOMO ${r.homoHa} Ha, LUMO ${r.lumoHa} Ha${r.converged ? '' : ' (NOT CONVERGED)'}\n`);
		return records.every((r) => r.converged) ? 0 : 1;
	}
};
