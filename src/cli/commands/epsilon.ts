// `kappaline epsilon`: analyse a dielectric tensor file, or estimate epsilon by Clausius–Mossotti.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { polymorphFromCif } from '$lib/formats/cif';
import { parseDielectricTensor } from '$lib/formats/tensor';
import { analyseTensor, clausiusMossottiEpsilon, directionFromUvw, epsilonAlong, type PolarizabilityUnit } from '$lib/science/dielectric';
import { cellMatrix } from '$lib/science/lattice';
import { CliInputError, CliUsageError, type CliCommand, type CliIo } from '../types';

const USAGE =
	'kappaline epsilon TENSOR_FILE [--direction x,y,z | --uvw u,v,w --cif FILE] [--json]\n' +
	'       kappaline epsilon --cm --polarizability A3 --volume-per-molecule A3 [--unit A3|bohr3|SI] [--json]';

function vector(text: string, flag: string): number[] {
	const parts = text.split(/[\s,]+/).filter(Boolean).map(Number);
	if (parts.length !== 3 || parts.some((x) => !Number.isFinite(x))) throw new CliUsageError(`${flag} needs three numbers separated by commas, got "${text}"`);
	return parts;
}

function number(text: string | undefined, flag: string): number {
	if (text === undefined) throw new CliUsageError(`${flag} is required with --cm`);
	const v = Number(text);
	if (!Number.isFinite(v)) throw new CliUsageError(`${flag} must be a number, got "${text}"`);
	return v;
}

function readText(io: CliIo, file: string): string {
	try {
		return readFileSync(resolve(io.cwd, file), 'utf8');
	} catch (e) {
		throw new CliInputError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
	}
}

const f = (v: number, d = 4) => v.toFixed(d);

export const command: CliCommand = {
	name: 'epsilon',
	summary: 'principal values and means of a dielectric tensor, or a Clausius–Mossotti estimate',
	usage: USAGE,
	async run(args, io) {
		let parsed;
		try {
			parsed = parseArgs({
				args,
				allowPositionals: true,
				options: {
					direction: { type: 'string' },
					uvw: { type: 'string' },
					cif: { type: 'string' },
					json: { type: 'boolean', default: false },
					cm: { type: 'boolean', default: false },
					polarizability: { type: 'string' },
					'volume-per-molecule': { type: 'string' },
					unit: { type: 'string', default: 'A3' }
				}
			});
		} catch (e) {
			throw new CliUsageError((e as Error).message);
		}
		const { values: o, positionals } = parsed;

		if (o.cm) {
			if (positionals.length > 0) throw new CliUsageError('--cm takes no tensor file');
			const unit = o.unit as PolarizabilityUnit;
			if (!['A3', 'bohr3', 'SI'].includes(unit)) throw new CliUsageError(`--unit must be A3, bohr3 or SI, got "${o.unit}"`);
			const r = clausiusMossottiEpsilon({ polarizability: number(o.polarizability, '--polarizability'), unit, volumePerMoleculeA3: number(o['volume-per-molecule'], '--volume-per-molecule') });
			if (o.json) {
				io.stdout.write(JSON.stringify({ epsilon: r.epsilon, x: r.x, polarizabilityVolumeA3: r.polarizabilityVolumeA3, volumePerMoleculeA3: r.volumePerMoleculeA3, warnings: r.warnings }, null, 2) + '\n');
			} else {
				io.stdout.write(
					`Clausius–Mossotti: x = 4 pi alpha' / (3 V_m) = 4 pi ${f(r.polarizabilityVolumeA3, 3)} / (3 x ${f(r.volumePerMoleculeA3, 3)}) = ${f(r.x, 5)}\n` +
						`epsilon = (1 + 2x)/(1 - x) = ${f(r.epsilon)}\n` +
						r.warnings.map((w) => `warning: ${w}\n`).join('')
				);
			}
			return 0;
		}

		if (positionals.length !== 1) throw new CliUsageError('give one tensor file (or --cm)');
		if (o.direction && o.uvw) throw new CliUsageError('give either --direction or --uvw, not both');
		if (o.uvw && !o.cif) throw new CliUsageError('--uvw needs --cif FILE for the cell');
		if (o.cif && !o.uvw) throw new CliUsageError('--cif is only used with --uvw');
		const file = positionals[0];
		const tensor = parseDielectricTensor(readText(io, file));
		const a = analyseTensor(tensor.matrix);
		let directional: number | null = null;
		let unitVector: number[] | null = null;
		if (o.direction) {
			const d = vector(o.direction, '--direction');
			directional = epsilonAlong(a.symmetric, d);
			const n = Math.hypot(d[0], d[1], d[2]);
			unitVector = d.map((x) => x / n);
		} else if (o.uvw) {
			const cif = polymorphFromCif(readText(io, o.cif as string));
			const cell = { a: cif.cell.a.value, b: cif.cell.b.value, c: cif.cell.c.value, alphaDeg: cif.cell.alphaDeg.value, betaDeg: cif.cell.betaDeg.value, gammaDeg: cif.cell.gammaDeg.value };
			unitVector = directionFromUvw(cellMatrix(cell), vector(o.uvw, '--uvw'));
			directional = epsilonAlong(a.symmetric, unitVector);
		}
		if (o.json) {
			io.stdout.write(
				JSON.stringify(
					{
						principal: a.principalValues,
						principalAxes: a.principalAxes,
						mean: a.traceMean,
						harmonicMean: a.harmonicMean,
						geometricMean: a.geometricMean,
						anisotropyRatio: a.anisotropyRatio,
						directional,
						direction: unitVector,
						format: tensor.format,
						symmetrised: a.symmetrised,
						warnings: a.warnings
					},
					null,
					2
				) + '\n'
			);
			return 0;
		}
		const lines = [
			`tensor read as ${tensor.format}${a.symmetrised ? ' (symmetrised)' : ''}`,
			'principal values (ascending) and axes:',
			...a.principalValues.map((v, i) => `  ${f(v)}  (${a.principalAxes[i].map((x) => f(x, 4)).join(', ')})`),
			`trace/3 (default, common practice): ${f(a.traceMean)}`,
			`harmonic mean:                      ${f(a.harmonicMean)}`,
			`geometric mean:                     ${f(a.geometricMean)}`,
			`anisotropy max/min:                 ${f(a.anisotropyRatio)}`
		];
		if (directional !== null && unitVector) lines.push(`along ${o.uvw ? `[${o.uvw}]` : o.direction} (unit ${unitVector.map((x) => f(x, 4)).join(', ')}): ${f(directional)}`);
		for (const w of a.warnings) lines.push(`warning: ${w}`);
		io.stdout.write(lines.join('\n') + '\n');
		return 0;
	}
};
