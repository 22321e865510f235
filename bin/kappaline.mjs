#!/usr/bin/env node
// The `kappaline` command line: the same science code as the web app, with no server and no database.
// TypeScript sources are loaded through tsx with a tsconfig that maps $lib, so it works right after `npm ci`.
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { tsImport } from 'tsx/esm/api';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const { main } = await tsImport(pathToFileURL(join(root, 'src', 'cli', 'main.ts')).href, {
	parentURL: import.meta.url,
	tsconfig: join(root, 'tsconfig.cli.json')
});
process.exitCode = await main(process.argv.slice(2), { stdout: process.stdout, stderr: process.stderr, cwd: process.cwd() });
