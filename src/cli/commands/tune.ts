// `kappaline tune SCAN.csv`: gamma* of a gas-phase tuning scan, with no server and no database.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { ScanTableError, parseScanPoints } from '$lib/formats/scan-table';
import { bohrInvToAngInv } from '$lib/science/units';
import { TuningInputError } from '$lib/science/tuning/tuning-input-error';
import { tuningAnalysis } from '$lib/science/tuning/tuning-analysis';
import type { TuningObjective } from '$lib/science/tuning/types';
import { CliInputError, CliUsageError, type CliCommand } from '../types';

const OBJECTIVES: Record<string, TuningObjective> = { abs: 'abs-sum', squares: 'square-sum', 'ip-only': 'ip-only', lumo: 'lumo-variant' };
const USAGE = 'kappaline tune SCAN.csv [--objective abs|squares|ip-only|lumo] [--basis NAME] [--energy-unit hartree|eV] [--json]';

export interface TuneArgs {
	file: string;
	objective: TuningObjective;
	basis: string | null;
	energyUnit: 'hartree' | 'eV' | undefined;
	json: boolean;
}

export function parseTuneArgs(args: string[]): TuneArgs {
	let file: string | null = null;
	let objective: TuningObjective = 'abs-sum';
	let basis: string | null = null;
	let energyUnit: 'hartree' | 'eV' | undefined;
	let json = false;
	for (let i = 0; i < args.length; i++) {
		const a = args[i];
		const value = (name: string) => {
			const eq = a.indexOf('=');
			if (eq >= 0) return a.slice(eq + 1);
			const v = args[++i];
			if (v === undefined) throw new CliUsageError(`${name} needs a value`);
			return v;
		};
		if (a === '--json') json = true;
		else if (a === '--objective' || a.startsWith('--objective=')) {
			const v = value('--objective');
			if (!(v in OBJECTIVES)) throw new CliUsageError(`--objective must be one of ${Object.keys(OBJECTIVES).join(', ')}, got "${v}"`);
			objective = OBJECTIVES[v];
		} else if (a === '--basis' || a.startsWith('--basis=')) basis = value('--basis');
		else if (a === '--energy-unit' || a.startsWith('--energy-unit=')) {
			const v = value('--energy-unit');
			if (v !== 'hartree' && v !== 'eV') throw new CliUsageError(`--energy-unit must be hartree or eV, got "${v}"`);
			energyUnit = v;
		} else if (a.startsWith('-')) throw new CliUsageError(`unknown option ${a}`);
		else if (file === null) file = a;
		else throw new CliUsageError(`one scan file at a time (got "${file}" and "${a}")`);
	}
	if (file === null) throw new CliUsageError('give the scan table (CSV or TSV with a header row)');
	return { file, objective, basis, energyUnit, json };
}

const f = (v: number | null | undefined, digits: number) => (v === null || v === undefined ? 'n/a' : v.toFixed(digits));

export const command: CliCommand = {
	name: 'tune',
	summary: 'optimal range-separation parameter gamma* of a gas-phase tuning scan (CSV/TSV)',
	usage: USAGE,
	async run(args, io) {
		const opts = parseTuneArgs(args);
		let text: string;
		try {
			text = readFileSync(resolve(io.cwd, opts.file), 'utf8');
		} catch (e) {
			throw new CliInputError(`cannot read ${opts.file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
		}
		let analysis;
		try {
			const points = parseScanPoints(text, { energyUnit: opts.energyUnit });
			analysis = tuningAnalysis(points, { objective: opts.objective, basisSet: opts.basis });
		} catch (e) {
			if (e instanceof ScanTableError || e instanceof TuningInputError) throw new CliInputError(`${opts.file}: ${e.message}`);
			throw e;
		}
		const r = analysis.result;
		const o = r.optimum;
		if (!o) {
			const errors = r.diagnostics.filter((d) => d.severity === 'error');
			throw new CliInputError(`${opts.file}: no optimum: ${errors.map((d) => `${d.message} ${d.action}`).join(' ')}`);
		}
		const out = {
			gammaStar: o.gammaBohrInv,
			gammaStarAngInv: bohrInvToAngInv(o.gammaBohrInv),
			objective: r.objective,
			objectiveAtOptimum: o.objectiveValue,
			objectiveUnit: r.objectiveUnit,
			crossings: { ip: r.crossings.jIpBohrInv, ea: r.objective === 'lumo-variant' ? r.crossings.jEaLumoBohrInv : r.crossings.jEaBohrInv },
			ipEv: o.ipEv,
			eaEv: o.eaEv,
			gapEv: o.gapEv,
			homoEv: o.minusHomoEv === null ? null : -o.minusHomoEv,
			lumoEv: o.minusLumoEv === null ? null : -o.minusLumoEv,
			bestGridPoint: r.bestGridPoint ? r.bestGridPoint.gammaBohrInv : null,
			refinedGrid: analysis.refinedGridBohrInv,
			diagnostics: r.diagnostics.map((d) => ({ code: d.code, severity: d.severity, message: d.message, action: d.action })),
			analysisVersion: analysis.analysisVersion,
			inputHash: analysis.inputHash
		};
		if (opts.json) {
			io.stdout.write(JSON.stringify(out, null, 2) + '\n');
			return 0;
		}
		const lines = [
			`gamma*        ${f(out.gammaStar, 4)} bohr^-1 (${f(out.gammaStarAngInv, 4)} Å^-1), objective ${r.objective} = ${f(out.objectiveAtOptimum, 4)} ${r.objectiveUnit}`,
			`crossings     J_IP = 0 at ${f(out.crossings.ip, 4)}, EA term = 0 at ${f(out.crossings.ea, 4)} bohr^-1`,
			`at gamma*     IP ${f(out.ipEv, 3)} eV, EA ${f(out.eaEv, 3)} eV, gap ${f(out.gapEv, 3)} eV; eps_HOMO ${f(out.homoEv, 3)} eV, eps_LUMO ${f(out.lumoEv, 3)} eV (gas phase)`,
			`refined grid  ${out.refinedGrid.join(' ') || '(none)'}`,
			...(r.diagnostics.length ? ['diagnostics:', ...r.diagnostics.map((d) => `  [${d.severity}] ${d.code}: ${d.message}\n      what to do: ${d.action}`)] : ['diagnostics:  none']),
			'Gas-phase estimates for planning and comparison; check against measurement before device decisions.'
		];
		io.stdout.write(lines.join('\n') + '\n');
		return 0;
	}
};
