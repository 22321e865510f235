import pkg from '../../../package.json' with { type: 'json' };
import type { CliCommand } from '../types';

export const command: CliCommand = {
	name: 'version',
	summary: 'print the Kappaline version',
	usage: 'kappaline version',
	async run(_args, io) {
		io.stdout.write(`kappaline ${pkg.version}\n`);
		return 0;
	}
};
