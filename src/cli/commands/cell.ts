// `kappaline cell`: cell, volume, volume per molecule and density of a CIF.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { polymorphFromCif } from '$lib/formats/cif';
import { CliInputError, CliUsageError, type CliCommand } from '../types';

export const command: CliCommand = {
	name: 'cell',
	summary: 'cell, volume, V/Z and density of a CIF file',
	usage: 'kappaline cell CIF_FILE [--json]',
	async run(args, io) {
		let parsed;
		try {
			parsed = parseArgs({ args, allowPositionals: true, options: { json: { type: 'boolean', default: false } } });
		} catch (e) {
			throw new CliUsageError((e as Error).message);
		}
		if (parsed.positionals.length !== 1) throw new CliUsageError('give one CIF file');
		const file = parsed.positionals[0];
		let text: string;
		try {
			text = readFileSync(resolve(io.cwd, file), 'utf8');
		} catch (e) {
			throw new CliInputError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
		}
		const p = polymorphFromCif(text);
		const cell = Object.fromEntries(Object.entries(p.cell).map(([k, m]) => [k, m.value])) as Record<string, number>;
		const out = {
			blockName: p.blockName,
			cell,
			spaceGroup: p.spaceGroup.hermannMauguin ?? null,
			spaceGroupNumber: p.spaceGroup.number ?? null,
			z: p.z ?? null,
			formula: p.formula?.hill ?? null,
			volumeA3: p.volumeA3,
			volumeSuA3: p.volumeSuA3 ?? null,
			volumePerMoleculeA3: p.volumePerMoleculeA3 ?? null,
			densityGcm3: p.densityGPerCm3 ?? null,
			atomSites: p.atomSites.length,
			warnings: p.warnings
		};
		if (parsed.values.json) {
			io.stdout.write(JSON.stringify(out, null, 2) + '\n');
			return 0;
		}
		const f = (v: number | null, d: number) => (v === null ? '—' : v.toFixed(d));
		io.stdout.write(
			[
				`data block ${out.blockName}: ${out.spaceGroup ?? 'space group not given'}${out.spaceGroupNumber ? ` (No. ${out.spaceGroupNumber})` : ''}, Z = ${out.z ?? '?'}, ${out.formula ?? 'formula not given'}`,
				`a, b, c = ${f(cell.a, 4)}, ${f(cell.b, 4)}, ${f(cell.c, 4)} Å; alpha, beta, gamma = ${f(cell.alphaDeg, 3)}, ${f(cell.betaDeg, 3)}, ${f(cell.gammaDeg, 3)}°`,
				`volume:               ${f(out.volumeA3, 3)} Å³${out.volumeSuA3 !== null ? ` (su ${f(out.volumeSuA3, 3)})` : ''}`,
				`volume per molecule:  ${f(out.volumePerMoleculeA3, 3)} Å³`,
				`density:              ${f(out.densityGcm3, 4)} g/cm³`,
				`atom sites:           ${out.atomSites}`,
				...out.warnings.map((w) => `warning: ${w}`)
			].join('\n') + '\n'
		);
		return 0;
	}
};
