export interface CliIo {
	stdout: { write(s: string): unknown };
	stderr: { write(s: string): unknown };
	cwd: string;
}

/** A subcommand: parses its own arguments, returns the exit status (0 ok, 1 bad input, 2 usage). */
export interface CliCommand {
	name: string;
	summary: string;
	usage: string;
	run(args: string[], io: CliIo): Promise<number>;
}

/** Raised for unusable input; main prints the message on stderr and exits 1. */
export class CliInputError extends Error {}
/** Raised for wrong arguments; main prints the message and the command's usage, and exits 2. */
export class CliUsageError extends Error {}
