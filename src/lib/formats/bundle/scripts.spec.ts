import { describe, expect, it } from 'vitest';
import { BundleInputError } from './errors';
import { DEFAULT_SCRIPT_SETTINGS, checkScriptSettings, pbsScript, runLocalScript, slurmScript } from './scripts';

// The scripts are checked as text here (no files are written by the tests); `bash -n` was run on
// generated copies by hand. Slurm options: sbatch(1) --array, --ntasks, --time, --mem, --account,
// --partition; SLURM_ARRAY_TASK_ID and SLURM_SUBMIT_DIR from sbatch's output environment variables.
// PBS Pro: qsub -J, -l select=...:ncpus=...:mem=..., PBS_ARRAY_INDEX, PBS_O_WORKDIR; Torque: -t, PBS_ARRAYID.

const decks = ['tuning/g0p2000/neutral.nw', 'tuning/g0p2000/cation.nw', 'screened/eps3p000/neutral.nw'];
const ctx = { decks, title: 'SO2: tuning scan', settings: checkScriptSettings({ account: 'chem42', partition: 'short', queue: 'workq' }) };

/** Rough structural checks that catch a broken generator: balanced blocks and quotes, no tabs. */
function expectPlainBash(text: string) {
	const code = text
		.split('\n')
		.filter((l) => !/^\s*#/.test(l))
		.map((l) => l.replace(/\s+#\s.*$/, ''));
	const count = (re: RegExp) => code.filter((l) => re.test(l)).length;
	expect(count(/^\s*if\s/)).toBe(count(/(?:^\s*|;\s*)fi$/));
	expect(count(/(?:^\s*|;\s*)do$/)).toBe(count(/^\s*done$/));
	expect(count(/^\s*for\s/)).toBe(count(/^\s*done$/));
	expect(code.filter((l) => /\(\) \{$/.test(l)).length).toBe(code.filter((l) => l === '}').length);
	for (const l of code) expect((l.replace(/\\"/g, '').match(/"/g) ?? []).length % 2, l).toBe(0);
	expect(text).not.toContain('\t');
	expect(text.endsWith('\n')).toBe(true);
}

describe('run-local.sh', () => {
	const text = runLocalScript(ctx);

	it('begins with a comment block saying what it is', () => {
		const lines = text.split('\n');
		expect(lines[0]).toBe('#!/usr/bin/env bash');
		expect(lines[2]).toBe('# Kappaline run-local.sh: run every NWChem deck of this bundle on this machine');
		expect(lines.slice(0, 15).every((l) => l.startsWith('#'))).toBe(true);
	});

	it('loops over the decks with mpirun -np N nwchem deck.nw > deck.out, in each deck folder', () => {
		expect(text).toContain(['DECKS=(', '  "tuning/g0p2000/neutral.nw"', '  "tuning/g0p2000/cation.nw"', '  "screened/eps3p000/neutral.nw"', ')'].join('\n'));
		expect(text).toContain('NPROC="${NPROC:-4}"');
		expect(text).toContain('mpirun $MPI_FLAGS -np "$NPROC" nwchem "$1"');
		expect(text).toContain('(cd "$dir" && run_engine "$name.nw" > "$name.out" 2> "$name.err")');
	});

	it('prints progress and skips finished outputs (NWChem\'s closing "Total times" line)', () => {
		expect(text).toContain('echo "[$i/$total] $deck: finished earlier, skipped"');
		expect(text).toContain('grep -q "Total times" "$1"');
	});

	it('is plain bash', () => expectPlainBash(text));
});

describe('submit-slurm.sh', () => {
	const text = slurmScript(ctx);

	it('editable resources at the top, before the deck list', () => {
		const top = text.slice(0, text.indexOf('DECKS=('));
		for (const s of ['ACCOUNT="chem42"', 'PARTITION="short"', 'TIME="04:00:00"', 'CORES="4"', 'MEMORY="8G"', 'MAX_PARALLEL="20"', 'srun nwchem "$1"']) {
			expect(top).toContain(s);
		}
	});

	it('submits itself as a job array, one task per deck', () => {
		expect(text).toContain('--array="1-${#DECKS[@]}%$MAX_PARALLEL" --ntasks="$CORES" --time="$TIME"');
		expect(text).toContain('exec sbatch "${args[@]}" "$(basename "$0")"');
		expect(text).toContain('index="$SLURM_ARRAY_TASK_ID"');
		expect(text).toContain('cd "$SLURM_SUBMIT_DIR" || exit 1');
	});

	it('is plain bash', () => expectPlainBash(text));
});

describe('submit-pbs.sh', () => {
	const text = pbsScript({ ...ctx, settings: checkScriptSettings({ memory: '16GB', queue: 'workq' }) });

	it('editable resources at the top; PBS memory units', () => {
		const top = text.slice(0, text.indexOf('DECKS=('));
		for (const s of ['QUEUE="workq"', 'MEMORY="16gb"', 'ARRAY_FLAG="-J"', 'RESOURCES="select=1:ncpus=${CORES}:mpiprocs=${CORES}:mem=${MEMORY}"', 'mpirun -np "$CORES" nwchem "$1"']) {
			expect(top).toContain(s);
		}
	});

	it('submits itself with qsub as an array; PBS Pro and Torque indices', () => {
		expect(text).toContain('args+=("$ARRAY_FLAG" "1-${#DECKS[@]}")');
		expect(text).toContain('exec qsub "${args[@]}" "$(basename "$0")"');
		expect(text).toContain('index="${PBS_ARRAY_INDEX:-${PBS_ARRAYID:-1}}"');
	});

	it('is plain bash', () => expectPlainBash(text));
});

describe('script settings', () => {
	it('defaults', () => expect(checkScriptSettings(undefined)).toEqual(DEFAULT_SCRIPT_SETTINGS));
	it.each([
		[{ cores: 0 }, 'scripts.cores: cores must be an integer in [1, 100000], got 0'],
		[{ time: '4h' }, 'scripts.time: time must look like 04:00:00 or 1-00:00:00, got "4h"'],
		[{ partition: 'a"b' }, "scripts.partition: partition may contain only letters, digits, '_', '.' or '-', got \"a\\\"b\""],
		[{ jobName: '1job' }, 'scripts.jobName: jobName must start with a letter']
	])('refuses %o', (over, message) => {
		expect(() => checkScriptSettings(over)).toThrow(BundleInputError);
		expect(() => checkScriptSettings(over)).toThrow(message);
	});
	it('refuses deck paths a shell could misread', () => {
		expect(() => runLocalScript({ ...ctx, decks: ['tuning/$(rm -rf ~).nw'] })).toThrow('decks[0]: unsafe or non-NWChem deck path');
	});
});
