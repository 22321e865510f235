/**
 * `README.txt` of a run bundle: what each folder holds, how to run it, how to bring the outputs
 * back, and the cautions that come with the numbers (the project's science notes, sections 6 and 7).
 */
import { PSI4_MIN_VERSION, PSI4_VERSION_NOTE, formatReal } from '../decks';
import type { BundleEngine } from './manifest';

/** What the README describes. */
export interface ReadmeContext {
	/** Default nwchem. */
	engine?: BundleEngine;
	moleculeName: string;
	formula: string;
	charge: number;
	multiplicity: number;
	appVersion: string;
	createdAt: string;
	basis: string;
	alpha: number;
	tuning: { gammasBohrInv: readonly number[]; layout: 'per-state' | 'combined'; folders: readonly string[] } | null;
	screened: { gammaBohrInv: number; runs: readonly { epsilon: number; beta: number; folder: string }[] } | null;
	deckCount: number;
	cores: number;
}

function clean(text: string): string {
	// eslint-disable-next-line no-control-regex
	return text.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim();
}

/** Words of `text` in lines of at most 78 characters, each starting with `indent`. */
function wrap(text: string, indent: string): string[] {
	const out: string[] = [];
	let line = indent;
	for (const word of text.split(' ')) {
		if (line.length > indent.length && line.length + 1 + word.length > 78) {
			out.push(line);
			line = indent;
		}
		line += line.length > indent.length ? ` ${word}` : word;
	}
	out.push(line);
	return out;
}

/** The README text (plain ASCII apart from the molecule name as given). */
export function bundleReadme(c: ReadmeContext): string {
	const L: string[] = [];
	const rule = '='.repeat(78);
	const psi4 = c.engine === 'psi4';
	const ext = psi4 ? 'in' : 'nw';
	L.push(rule, `Kappaline run bundle: ${psi4 ? 'Psi4 inputs' : 'NWChem decks'}, scripts and manifest`, rule, '');
	if (psi4) L.push(...wrap(PSI4_VERSION_NOTE, '  '), '');
	L.push(`Molecule      : ${clean(c.moleculeName)} (${c.formula}), charge ${c.charge}, multiplicity ${c.multiplicity}`);
	L.push(`Functional    : SRSH-PBE, alpha = ${formatReal(c.alpha)} (short-range exact-exchange fraction)`);
	L.push(`Basis         : ${c.basis}`);
	L.push(`Decks         : ${c.deckCount}`);
	L.push(`Made by       : Kappaline ${clean(c.appVersion)} at ${clean(c.createdAt)}`, '');

	L.push('WHAT IS IN THIS FOLDER', '');
	L.push('  manifest.json   what the bundle was made from (molecule, geometry, charges and multiplicities,');
	L.push('                  alpha, beta, gamma, epsilon, engine, basis) and every file with its SHA-256.');
	L.push('                  Kappaline uses it to match each output to its calculation: keep it.');
	L.push('  run-local.sh    runs every deck in sequence on this machine (progress line per deck).');
	L.push('  submit-slurm.sh submits every deck as a Slurm job array (resources at the top of the file).');
	L.push('  submit-pbs.sh   the same for PBS Pro or Torque.');
	if (c.tuning) {
		L.push('  tuning/         gas-phase gamma tuning, alpha + beta = 1: one folder per gamma (bohr^-1),');
		L.push('                  named g<integer>p<decimals>, e.g. g0p2500 = 0.25 bohr^-1.');
		if (c.tuning.layout === 'per-state') {
			L.push(`                  neutral.${ext} (N electrons), cation.${ext} (N-1), anion.${ext} (N+1), all at the same`);
			L.push('                  frozen geometry; the ions are spin-unrestricted.');
		} else {
			L.push(`                  neutral-cation-anion.${ext}: the three states (N, N-1, N+1 electrons) in one deck,`);
			L.push('                  at the same frozen geometry; the ions are spin-unrestricted.');
		}
		L.push(`                  Gammas: ${c.tuning.gammasBohrInv.map((g) => formatReal(g, 6)).join(', ')} bohr^-1.`);
	}
	if (c.screened) {
		L.push('  screened/       screened reruns of the neutral, one folder per dielectric constant epsilon,');
		L.push('                  named eps<integer>p<3 decimals>, e.g. eps3p000 = 3.000; long-range exact-exchange');
		L.push(`                  fraction 1/epsilon (beta = 1/epsilon - alpha), gamma = ${formatReal(c.screened.gammaBohrInv, 6)} bohr^-1.`);
		for (const r of c.screened.runs) {
			L.push(`                  ${r.folder}/neutral.${ext}: epsilon = ${formatReal(r.epsilon, 6)}, beta = ${formatReal(r.beta, 9)}${r.beta < 0 ? ' (negative: legal)' : ''}`);
		}
	}
	L.push('');
	L.push('Each deck begins with a comment block: what it computes, what alpha, beta and gamma mean and');
	if (psi4) {
		L.push('where they came from. Basis, SCF type, grid, convergence and memory are grouped at the top and');
		L.push('may be edited; the dictionary functional below them is derived from alpha, beta and gamma:');
		L.push('leave it.', '');
	} else {
		L.push('where they came from. Basis, grid, convergence and memory are grouped at the top and may be');
		L.push('edited; the functional lines below them are derived from alpha, beta and gamma: leave them.', '');
	}

	L.push('HOW TO RUN', '');
	if (psi4) {
		L.push(`  Needs Psi4 ${PSI4_MIN_VERSION} or newer (threaded; no MPI launcher). The command is the variable PSI4`);
		L.push('  at the top of each script (default: psi4 on the PATH).');
		L.push(`  On this machine:   bash run-local.sh           (NTHREADS=${c.cores} threads per deck; set`);
		L.push('                     NTHREADS=8 bash run-local.sh to change, PSI4=/path/to/psi4 for another');
		L.push('                     Psi4)');
		L.push('  With Slurm:        edit the resources at the top of submit-slurm.sh, then bash submit-slurm.sh');
		L.push('  With PBS:          edit the resources at the top of submit-pbs.sh, then bash submit-pbs.sh');
		L.push('  By hand:           cd into a deck\'s folder and run  psi4 -n 4 neutral.in -o neutral.out');
	} else {
		L.push('  Needs NWChem 7.x on the PATH (Debian/Ubuntu: apt-get install nwchem) and an MPI launcher.');
		L.push(`  On this machine:   bash run-local.sh           (NPROC=${c.cores} MPI processes per deck; set`);
		L.push('                     NPROC=8 bash run-local.sh to change; as root in a container add');
		L.push('                     MPI_FLAGS=--allow-run-as-root)');
		L.push('  With Slurm:        edit the resources at the top of submit-slurm.sh, then bash submit-slurm.sh');
		L.push('  With PBS:          edit the resources at the top of submit-pbs.sh, then bash submit-pbs.sh');
		L.push('  By hand:           cd into a deck\'s folder and run  mpirun -np 4 nwchem neutral.nw > neutral.out');
	}
	L.push('  Every output must sit beside its deck with the same base name and the extension .out.');
	L.push('  All scripts skip decks whose output is already finished, so they can simply be rerun.', '');

	L.push('HOW TO BRING THE OUTPUTS BACK', '');
	L.push(`  Zip this whole folder (decks, outputs and manifest.json; the ${psi4 ? 'timer.dat and scratch' : '.movecs and scratch'} files may be`);
	L.push('  left out) and upload the zip on the molecule\'s page in Kappaline. Single .out files can be');
	L.push('  uploaded too. Kappaline shows which scan points or rerun results each file fills, what is');
	L.push('  missing and what failed, and stores nothing until you confirm.', '');

	L.push('CAUTIONS', '');
	if (psi4) {
		L.push('  - Psi4 1.3.2 (the Debian 12 package) stops with "set_omega not implemented": it cannot set gamma');
		L.push('    on the short-range PBE exchange. Check the version with psi4 --version before a long run.');
		L.push('  - In the dictionary functional, "alpha" inside an x_functionals entry is that term\'s weight,');
		L.push('    while x_hf\'s alpha and beta are the exact-exchange fractions: edit neither by hand.');
		L.push('  - Do not rename inputs: the outputs are matched by path (folder and base name).');
	} else {
		L.push('  - Do not reorder the "cam" line: NWChem reads cam, cam_alpha, cam_beta by position and any other');
		L.push('    order silently sets both exact-exchange fractions to 0.');
		L.push('  - NWChem echoes alpha, beta and gamma rounded to 2 decimals; the values in the deck are the ones');
		L.push('    used. Do not rename decks or start names: the outputs are matched by path and start name.');
	}
	L.push('  - The anion needs diffuse basis functions (aug-, +, -D sets); a positive anion HOMO means it is');
	L.push('    unbound in this basis or physically unbound.');
	L.push('  - A run that failed to converge is reported as such and not used; rerun it with more');
	L.push('    iterations or a different initial guess.');
	L.push('  - The solid-state levels from the screened rerun are model estimates for planning and');
	L.push('    comparison. They neglect band dispersion, vibrational and geometric relaxation and disorder; a');
	L.push('    film\'s surface and interfaces screen differently from the bulk. Check them against');
	L.push('    measurement (photoemission, inverse photoemission) before device decisions.', '');
	return L.join('\n');
}
