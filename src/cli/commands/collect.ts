import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { ingestOutputs, type IngestFileInput } from '$lib/formats/bundle';
import { writeScanCsv } from '$lib/formats/scan-table';
import { CliInputError, CliUsageError, type CliCommand } from '../types';

function walk(dir: string, root: string, out: IngestFileInput[]) {
	for (const name of readdirSync(dir)) {
		const path = join(dir, name);
		const st = statSync(path);
		if (st.isDirectory()) walk(path, root, out);
		else if (/\.(out|nw|log)$/i.test(name) || name === 'manifest.json') out.push({ name: relative(root, path), bytes: readFileSync(path) });
	}
}

/** A finished scan folder (a bundle with outputs beside the decks) to the canonical scan CSV of the tuning analysis. */
export const command: CliCommand = {
	name: 'collect',
	summary: 'turn a finished scan folder into the canonical scan CSV (gamma, energies, orbital energies in hartree)',
	usage: 'kappaline collect DIR [--csv]',
	async run(args, io) {
		let parsed;
		try {
			parsed = parseArgs({ args, allowPositionals: true, options: { csv: { type: 'boolean', default: true } } });
		} catch (e) {
			throw new CliUsageError((e as Error).message);
		}
		const dir = parsed.positionals[0];
		if (!dir) throw new CliUsageError('give the folder of a finished scan');
		const files: IngestFileInput[] = [];
		try {
			walk(resolve(io.cwd, dir), resolve(io.cwd, dir), files);
		} catch (e) {
			throw new CliInputError(`${dir}: ${(e as Error).message}`);
		}
		const result = await ingestOutputs(files);
		for (const p of result.problems) io.stderr.write(`${p.severity}: ${p.file}: ${p.message}\n`);
		if (!result.scanPoints.length) throw new CliInputError(`no tuning-scan results found in ${dir}`);
		io.stdout.write(writeScanCsv(result.scanPoints, { header: 'canonical' }));
		return 0;
	}
};
