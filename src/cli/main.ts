// Entry point of the `kappaline` command line. Each subcommand lives in ./commands/<name>.ts and
// exports `command: CliCommand`; this file only dispatches.
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { CliInputError, CliUsageError, type CliCommand, type CliIo } from './types';

const commandsDir = join(dirname(fileURLToPath(import.meta.url)), 'commands');
const names = readdirSync(commandsDir)
	.filter((f) => f.endsWith('.ts') && !f.endsWith('.spec.ts'))
	.map((f) => f.replace(/\.ts$/, ''))
	.sort();

async function load(name: string): Promise<CliCommand | null> {
	if (!names.includes(name)) return null;
	const mod = (await import(pathToFileURL(join(commandsDir, `${name}.ts`)).href)) as { command: CliCommand };
	return mod.command;
}

export async function main(argv: string[], io: CliIo): Promise<number> {
	const [name, ...rest] = argv;
	if (!name || name === '--help' || name === '-h' || name === 'help') {
		const lines = ['usage: kappaline <command> [options]', '', 'commands:'];
		for (const n of names) {
			const c = await load(n);
			if (c) lines.push(`  ${c.name.padEnd(9)} ${c.summary}`);
		}
		io.stdout.write(lines.join('\n') + '\n');
		return name ? 0 : 2;
	}
	const cmd = await load(name);
	if (!cmd) {
		io.stderr.write(`kappaline: unknown command "${name}" (try kappaline --help)\n`);
		return 2;
	}
	try {
		return await cmd.run(rest, io);
	} catch (e) {
		if (e instanceof CliUsageError) {
			io.stderr.write(`kappaline ${cmd.name}: ${e.message}\nusage: ${cmd.usage}\n`);
			return 2;
		}
		if (e instanceof CliInputError || e instanceof Error) {
			io.stderr.write(`kappaline ${cmd.name}: ${e.message}\n`);
			return 1;
		}
		throw e;
	}
}
