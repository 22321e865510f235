/**
 * Shell scripts of a run bundle (bash): `run-local.sh` runs every deck in sequence on this machine,
 * `submit-slurm.sh` and `submit-pbs.sh` submit one job-array task per deck. Each opens with a comment
 * block saying what it is, keeps the editable resources and the engine command at the top, runs
 * each deck inside its own folder (NWChem writes its scratch files to the working directory), and
 * skips decks whose output is already finished: NWChem's closing "Total times" line, or Psi4's
 * "Psi4 exiting successfully" (both as printed by the fixture runs in decks/fixtures).
 *
 * NWChem runs under MPI (`mpirun -np N nwchem deck.nw`); Psi4 is threaded
 * (`psi4 -n N deck.in -o stdout`, so the output goes to standard output like NWChem's and lands
 * in `deck.out`; `-o stdout` checked with Debian's Psi4 1.3.2).
 *
 * Style kept deliberately plain (quoted expansions, no eval, values restricted to safe characters)
 * so the scripts pass `bash -n` and a linter without special cases.
 */
import { BundleInputError } from './errors';
import { isSafeBundlePath } from './manifest';

/** Editable resources written at the top of the scripts. */
export interface ScriptSettings {
	/** MPI processes per deck (run-local.sh, and cores per task on a cluster). */
	cores: number;
	/** Wall time per deck, Slurm/PBS format `HH:MM:SS` or `D-HH:MM:SS` (Slurm only). */
	time: string;
	/** Memory per deck, e.g. `8G`, `16000M`. */
	memory: string;
	/** Scheduler account (empty: the cluster's default). */
	account: string;
	/** Slurm partition (empty: default). */
	partition: string;
	/** PBS queue (empty: default). */
	queue: string;
	/** Most array tasks running at once. */
	maxParallel: number;
	/** Name of the scheduler job. */
	jobName: string;
}

export const DEFAULT_SCRIPT_SETTINGS: Readonly<ScriptSettings> = Object.freeze({
	cores: 4,
	time: '04:00:00',
	memory: '8G',
	account: '',
	partition: '',
	queue: '',
	maxParallel: 20,
	jobName: 'kappaline'
});

const SAFE_WORD = /^[A-Za-z0-9_.-]*$/;

/** Validate script settings; every value ends up inside double quotes, so only safe signs pass. */
export function checkScriptSettings(partial: Partial<ScriptSettings> | undefined, field = 'scripts'): ScriptSettings {
	const s: ScriptSettings = { ...DEFAULT_SCRIPT_SETTINGS, ...(partial ?? {}) };
	if (!Number.isInteger(s.cores) || s.cores < 1 || s.cores > 100000) {
		throw new BundleInputError(`${field}.cores`, `cores must be an integer in [1, 100000], got ${s.cores}`);
	}
	if (!Number.isInteger(s.maxParallel) || s.maxParallel < 1 || s.maxParallel > 10000) {
		throw new BundleInputError(`${field}.maxParallel`, `maxParallel must be an integer in [1, 10000], got ${s.maxParallel}`);
	}
	if (typeof s.time !== 'string' || !/^(\d+-)?\d{1,3}:\d{2}:\d{2}$/.test(s.time)) {
		throw new BundleInputError(`${field}.time`, `time must look like 04:00:00 or 1-00:00:00, got ${JSON.stringify(s.time)}`);
	}
	if (typeof s.memory !== 'string' || !/^\d+[KMGT]B?$/i.test(s.memory)) {
		throw new BundleInputError(`${field}.memory`, `memory must look like 8G or 16000M, got ${JSON.stringify(s.memory)}`);
	}
	for (const key of ['account', 'partition', 'queue'] as const) {
		if (typeof s[key] !== 'string' || !SAFE_WORD.test(s[key]) || s[key].length > 64) {
			throw new BundleInputError(`${field}.${key}`, `${key} may contain only letters, digits, '_', '.' or '-', got ${JSON.stringify(s[key])}`);
		}
	}
	if (typeof s.jobName !== 'string' || !/^[A-Za-z][A-Za-z0-9_.-]{0,63}$/.test(s.jobName)) {
		throw new BundleInputError(`${field}.jobName`, `jobName must start with a letter and use letters, digits, '_', '.' or '-', got ${JSON.stringify(s.jobName)}`);
	}
	return s;
}

/** Memory as Slurm writes it (`8G`). */
function slurmMemory(memory: string): string {
	return memory.replace(/b$/i, '').toUpperCase();
}

/** Memory as PBS writes it (`8gb`). */
function pbsMemory(memory: string): string {
	return `${memory.replace(/b$/i, '').toLowerCase()}b`;
}

/** The engine whose decks the scripts run. */
export type ScriptEngine = 'nwchem' | 'psi4';

/** What the scripts need to know about the bundle. */
export interface ScriptContext {
	/** Default nwchem. */
	engine?: ScriptEngine;
	/** Deck paths relative to the bundle folder, in run order. */
	decks: readonly string[];
	/** One line naming the molecule and calculation, for the header. */
	title: string;
	settings: ScriptSettings;
}

/** What differs between the engines' scripts. */
interface EngineProfile {
	/** Name in titles and comments. */
	label: string;
	/** Deck extension, with the dot. */
	ext: '.nw' | '.in';
	/** The `finished` shell function (with its comment). */
	finished: string[];
	/** run-local.sh: the comment lines on how a deck is run, and the editable engine lines. */
	localHow: string[];
	localEditable: (s: ScriptSettings) => string[];
	/** Slurm: the sbatch resource arguments for processes/threads, and run_engine's body. */
	slurmCores: string;
	slurmRun: string[];
	/** PBS: the select statement and run_engine's body. */
	pbsResources: string;
	pbsRun: string[];
	module: string;
}

const NWCHEM: EngineProfile = {
	label: 'NWChem',
	ext: '.nw',
	finished: [
		'# An output is finished when NWChem printed its closing "Total times" line.',
		'finished() {',
		'  [ -f "$1" ] && grep -q "Total times" "$1"',
		'}'
	],
	localHow: [
		'Runs each deck inside its own folder, one after another, as',
		'  mpirun -np NPROC nwchem deck.nw > deck.out',
		'and prints a progress line per deck. Decks whose output already ends with NWChem\'s',
		'"Total times" line are skipped, so the script can be rerun after an interruption.',
		'Usage: bash run-local.sh            (NPROC and the command below can be edited,',
		'       NPROC=8 bash run-local.sh     or set from the environment)'
	],
	localEditable: (s) => [
		`NPROC="\${NPROC:-${s.cores}}"`,
		'# Extra MPI flags, e.g. MPI_FLAGS="--allow-run-as-root" when running as root in a container.',
		'MPI_FLAGS="${MPI_FLAGS:-}"',
		'# How one deck is run; $1 is the deck file, run inside its folder, standard output is the .out.',
		'run_engine() {',
		'  # shellcheck disable=SC2086',
		'  mpirun $MPI_FLAGS -np "$NPROC" nwchem "$1"',
		'}'
	],
	slurmCores: '--ntasks="$CORES"',
	slurmRun: ['  srun nwchem "$1"', '  # or: mpirun -np "$CORES" nwchem "$1"'],
	pbsResources: 'RESOURCES="select=1:ncpus=${CORES}:mpiprocs=${CORES}:mem=${MEMORY}"',
	pbsRun: ['  mpirun -np "$CORES" nwchem "$1"'],
	module: 'nwchem'
};

const PSI4: EngineProfile = {
	label: 'Psi4',
	ext: '.in',
	finished: [
		'# An output is finished when Psi4 printed its closing "Psi4 exiting successfully" line.',
		'finished() {',
		'  [ -f "$1" ] && grep -q "Psi4 exiting successfully" "$1"',
		'}'
	],
	localHow: [
		'Runs each deck inside its own folder, one after another, as',
		'  psi4 -n NTHREADS deck.in -o stdout > deck.out',
		'and prints a progress line per deck. Decks whose output already ends with Psi4\'s',
		'"Psi4 exiting successfully" line are skipped, so the script can be rerun after an interruption.',
		'Needs Psi4 1.4 or newer (1.3.2 cannot set omega on the functional).',
		'Usage: bash run-local.sh               (NTHREADS and PSI4 below can be edited,',
		'       NTHREADS=8 bash run-local.sh     or set from the environment)'
	],
	localEditable: (s) => [
		`NTHREADS="\${NTHREADS:-${s.cores}}"`,
		'# The Psi4 command, e.g. PSI4=/opt/psi4/bin/psi4 or PSI4="conda run -n p4env psi4".',
		'PSI4="${PSI4:-psi4}"',
		'# How one deck is run; $1 is the deck file, run inside its folder, standard output is the .out.',
		'run_engine() {',
		'  # shellcheck disable=SC2086',
		'  $PSI4 -n "$NTHREADS" "$1" -o stdout',
		'}'
	],
	slurmCores: '--ntasks=1 --cpus-per-task="$CORES"',
	slurmRun: ['  "$PSI4" -n "$CORES" "$1" -o stdout'],
	pbsResources: 'RESOURCES="select=1:ncpus=${CORES}:mem=${MEMORY}"',
	pbsRun: ['  "$PSI4" -n "$CORES" "$1" -o stdout'],
	module: 'psi4'
};

function profileOf(ctx: ScriptContext): EngineProfile {
	const engine = ctx.engine ?? 'nwchem';
	if (engine !== 'nwchem' && engine !== 'psi4') throw new BundleInputError('engine', `engine must be nwchem or psi4, got ${JSON.stringify(engine)}`);
	return engine === 'psi4' ? PSI4 : NWCHEM;
}

function checkDecks(decks: readonly string[], p: EngineProfile): void {
	if (decks.length === 0) throw new BundleInputError('decks', 'a script needs at least one deck');
	decks.forEach((d, i) => {
		if (!isSafeBundlePath(d) || !d.endsWith(p.ext)) throw new BundleInputError(`decks[${i}]`, `unsafe or non-${p.label} deck path ${JSON.stringify(d)}`);
	});
}

const RULE = '# ' + '='.repeat(78);

function header(title: string, what: string[]): string[] {
	return ['#!/usr/bin/env bash', RULE, `# ${title}`, RULE, ...what.map((l) => (l ? `# ${l}` : '#')), RULE];
}

function deckArray(decks: readonly string[]): string[] {
	return ['DECKS=(', ...decks.map((d) => `  "${d}"`), ')'];
}

function clean(text: string): string {
	// eslint-disable-next-line no-control-regex
	return text.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim();
}

/** `run-local.sh`: every deck in sequence, with a progress line, skipping finished outputs. */
export function runLocalScript(ctx: ScriptContext): string {
	const p = profileOf(ctx);
	checkDecks(ctx.decks, p);
	const s = ctx.settings;
	const lines = [
		...header(`Kappaline run-local.sh: run every ${p.label} deck of this bundle on this machine`, [
			clean(ctx.title),
			'',
			...p.localHow,
			'When everything has run, zip this whole folder (outputs beside their decks, manifest.json',
			'included) and upload the zip to Kappaline.'
		]),
		'set -u',
		'',
		'# ---- EDITABLE -------------------------------------------------------------------',
		...p.localEditable(s),
		'# ---------------------------------------------------------------------------------',
		'',
		...p.finished,
		'',
		...deckArray(ctx.decks),
		'',
		'cd "$(dirname "$0")" || exit 1',
		'total=${#DECKS[@]}',
		'i=0',
		'failed=0',
		'for deck in "${DECKS[@]}"; do',
		'  i=$((i + 1))',
		'  dir=$(dirname "$deck")',
		`  name=$(basename "$deck" ${p.ext})`,
		'  out="$dir/$name.out"',
		'  if finished "$out"; then',
		'    echo "[$i/$total] $deck: finished earlier, skipped"',
		'    continue',
		'  fi',
		'  echo "[$i/$total] $deck: running ($(date +%H:%M:%S))"',
		`  if (cd "$dir" && run_engine "$name${p.ext}" > "$name.out" 2> "$name.err") && finished "$out"; then`,
		'    echo "[$i/$total] $deck: done ($(date +%H:%M:%S))"',
		'  else',
		'    failed=$((failed + 1))',
		'    echo "[$i/$total] $deck: FAILED, see $out and $dir/$name.err"',
		'  fi',
		'done',
		'echo "$((total - failed)) of $total decks finished; $failed failed."',
		'[ "$failed" -eq 0 ]',
		''
	];
	return lines.join('\n');
}

/** The editable Psi4 command of the cluster scripts (nothing for NWChem). */
function psi4Command(p: EngineProfile): string[] {
	return p === PSI4 ? ['# The Psi4 command (1.4 or newer), e.g. PSI4=/opt/psi4/bin/psi4', 'PSI4="${PSI4:-psi4}"'] : [];
}

/** Lines of an array task: pick the deck of this index, skip it when finished, run it. */
function taskBody(indexExpr: string, workDirVar: string, p: EngineProfile): string[] {
	return [
		`cd "${workDirVar}" || exit 1`,
		`index=${indexExpr}`,
		'deck="${DECKS[$((index - 1))]:-}"',
		'if [ -z "$deck" ]; then',
		'  echo "no deck number $index (this bundle has ${#DECKS[@]})" >&2',
		'  exit 1',
		'fi',
		'dir=$(dirname "$deck")',
		`name=$(basename "$deck" ${p.ext})`,
		'if finished "$dir/$name.out"; then',
		'  echo "$deck: finished earlier, skipped"',
		'  exit 0',
		'fi',
		'echo "$deck: running on $(hostname) from $(date)"',
		'cd "$dir" || exit 1',
		`run_engine "$name${p.ext}" > "$name.out" 2> "$name.err"`,
		'status=$?',
		'echo "$deck: exit status $status at $(date)"',
		'exit "$status"',
		''
	];
}

/**
 * `submit-slurm.sh`: `bash submit-slurm.sh` submits itself as a Slurm job array (one task per deck,
 * at most `maxParallel` at once) with the resources at the top; inside a task it runs its deck.
 */
export function slurmScript(ctx: ScriptContext): string {
	const p = profileOf(ctx);
	checkDecks(ctx.decks, p);
	const s = ctx.settings;
	const lines = [
		...header(`Kappaline submit-slurm.sh: run every ${p.label} deck of this bundle as a Slurm job array`, [
			clean(ctx.title),
			'',
			'Usage: edit the resources below, then from this folder:  bash submit-slurm.sh',
			'The script submits itself with sbatch as a job array, one task per deck (task N runs the',
			'Nth deck of the list below, inside the deck\'s folder, output beside the deck as .out).',
			'Tasks whose output is already finished exit at once, so resubmitting reruns only the rest.',
			'When all tasks are done, zip this whole folder and upload the zip to Kappaline.'
		]),
		'set -u',
		'',
		'# ---- EDITABLE RESOURCES ----------------------------------------------------------',
		`ACCOUNT="${s.account}"        # --account (empty: your default account)`,
		`PARTITION="${s.partition}"      # --partition (empty: the default partition)`,
		`TIME="${s.time}"     # wall time per deck`,
		p === PSI4 ? `CORES="${s.cores}"             # threads per deck (--cpus-per-task)` : `CORES="${s.cores}"             # MPI processes per deck (--ntasks)`,
		`MEMORY="${slurmMemory(s.memory)}"           # memory per deck (--mem)`,
		`MAX_PARALLEL="${s.maxParallel}"     # array tasks running at once`,
		`JOB_NAME="${s.jobName}"`,
		...psi4Command(p),
		`# Load the engine here if your cluster uses modules, e.g.:  module load ${p.module}`,
		'setup_environment() {',
		'  :',
		'}',
		'# How one deck is run; $1 is the deck file, run inside its folder, standard output is the .out.',
		'run_engine() {',
		...p.slurmRun,
		'}',
		'# ---------------------------------------------------------------------------------',
		'',
		...p.finished,
		'',
		...deckArray(ctx.decks),
		'',
		'if [ -z "${SLURM_ARRAY_TASK_ID:-}" ]; then',
		'  # Submission: this script, once per deck, as an array.',
		'  cd "$(dirname "$0")" || exit 1',
		`  args=(--job-name="$JOB_NAME" --array="1-\${#DECKS[@]}%$MAX_PARALLEL" ${p.slurmCores} --time="$TIME"`,
		'    --mem="$MEMORY" --output="slurm-%A_%a.log")',
		'  if [ -n "$ACCOUNT" ]; then args+=(--account="$ACCOUNT"); fi',
		'  if [ -n "$PARTITION" ]; then args+=(--partition="$PARTITION"); fi',
		'  exec sbatch "${args[@]}" "$(basename "$0")"',
		'fi',
		'',
		'# Array task: run deck number SLURM_ARRAY_TASK_ID (1-based) from the submission folder.',
		'setup_environment',
		...taskBody('"$SLURM_ARRAY_TASK_ID"', '$SLURM_SUBMIT_DIR', p)
	];
	return lines.join('\n');
}

/**
 * `submit-pbs.sh`: `bash submit-pbs.sh` submits itself with qsub as a job array (PBS Pro `-J`;
 * Torque users set ARRAY_FLAG to `-t`), one subjob per deck; inside a subjob it runs its deck.
 */
export function pbsScript(ctx: ScriptContext): string {
	const p = profileOf(ctx);
	checkDecks(ctx.decks, p);
	const s = ctx.settings;
	const lines = [
		...header(`Kappaline submit-pbs.sh: run every ${p.label} deck of this bundle as a PBS job array`, [
			clean(ctx.title),
			'',
			'Usage: edit the resources below, then from this folder:  bash submit-pbs.sh',
			'The script submits itself with qsub as a job array (PBS Pro: -J; Torque: set ARRAY_FLAG',
			'to -t and RESOURCES to nodes=1:ppn=...), one subjob per deck, run inside the deck\'s folder,',
			'output beside the deck as .out. Finished outputs are skipped, so resubmitting is safe.',
			'When all subjobs are done, zip this whole folder and upload the zip to Kappaline.'
		]),
		'set -u',
		'',
		'# ---- EDITABLE RESOURCES ----------------------------------------------------------',
		`ACCOUNT="${s.account}"        # -A (empty: your default account)`,
		`QUEUE="${s.queue}"          # -q (empty: the default queue)`,
		`TIME="${s.time}"     # walltime per deck`,
		`CORES="${s.cores}"             # ${p === PSI4 ? 'threads' : 'MPI processes'} per deck`,
		`MEMORY="${pbsMemory(s.memory)}"          # memory per deck`,
		`JOB_NAME="${s.jobName}"`,
		'ARRAY_FLAG="-J"          # PBS Pro: -J; Torque: -t',
		p.pbsResources,
		...psi4Command(p),
		`# Load the engine here if your cluster uses modules, e.g.:  module load ${p.module}`,
		'setup_environment() {',
		'  :',
		'}',
		'# How one deck is run; $1 is the deck file, run inside its folder, standard output is the .out.',
		'run_engine() {',
		...p.pbsRun,
		'}',
		'# ---------------------------------------------------------------------------------',
		'',
		...p.finished,
		'',
		...deckArray(ctx.decks),
		'',
		'if [ -z "${PBS_JOBID:-}" ]; then',
		'  # Submission: this script, once per deck, as an array (a single deck needs no array).',
		'  cd "$(dirname "$0")" || exit 1',
		'  args=(-N "$JOB_NAME" -S /bin/bash -l "$RESOURCES" -l "walltime=$TIME" -j oe)',
		'  if [ "${#DECKS[@]}" -gt 1 ]; then args+=("$ARRAY_FLAG" "1-${#DECKS[@]}"); fi',
		'  if [ -n "$ACCOUNT" ]; then args+=(-A "$ACCOUNT"); fi',
		'  if [ -n "$QUEUE" ]; then args+=(-q "$QUEUE"); fi',
		'  exec qsub "${args[@]}" "$(basename "$0")"',
		'fi',
		'',
		'# Subjob: run deck number PBS_ARRAY_INDEX (PBS Pro) or PBS_ARRAYID (Torque), 1-based.',
		'setup_environment',
		...taskBody('"${PBS_ARRAY_INDEX:-${PBS_ARRAYID:-1}}"', '$PBS_O_WORKDIR', p)
	];
	return lines.join('\n');
}
