/**
 * `README.txt` of a run bundle: what each folder holds, how to run it, how to bring the outputs
 * back, and the cautions that come with the numbers (the project's science notes, sections 6 and 7).
 */
import { formatReal } from '../decks';

/** What the README describes. */
export interface ReadmeContext {
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

/** The README text (plain ASCII apart from the molecule name as given). */
export function bundleReadme(c: ReadmeContext): string {
	const L: string[] = [];
	const rule = '='.repeat(78);
	L.push(rule, 'Kappaline run bundle: NWChem decks, scripts and manifest', rule, '');
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
			L.push('                  neutral.nw (N electrons), cation.nw (N-1), anion.nw (N+1), all at the same');
			L.push('                  frozen geometry; the ions are spin-unrestricted.');
		} else {
			L.push('                  neutral-cation-anion.nw: the three states (N, N-1, N+1 electrons) in one deck,');
			L.push('                  at the same frozen geometry; the ions are spin-unrestricted.');
		}
		L.push(`                  Gammas: ${c.tuning.gammasBohrInv.map((g) => formatReal(g, 6)).join(', ')} bohr^-1.`);
	}
	if (c.screened) {
		L.push('  screened/       screened reruns of the neutral, one folder per dielectric constant epsilon,');
		L.push('                  named eps<integer>p<3 decimals>, e.g. eps3p000 = 3.000; long-range exact-exchange');
		L.push(`                  fraction 1/epsilon (beta = 1/epsilon - alpha), gamma = ${formatReal(c.screened.gammaBohrInv, 6)} bohr^-1.`);
		for (const r of c.screened.runs) {
			L.push(`                  ${r.folder}/neutral.nw: epsilon = ${formatReal(r.epsilon, 6)}, beta = ${formatReal(r.beta, 9)}${r.beta < 0 ? ' (negative: legal)' : ''}`);
		}
	}
	L.push('');
	L.push('Each deck begins with a comment block: what it computes, what alpha, beta and gamma mean and');
	L.push('where they came from. Basis, grid, convergence and memory are grouped at the top and may be');
	L.push('edited; the functional lines below them are derived from alpha, beta and gamma: leave them.', '');

	L.push('HOW TO RUN', '');
	L.push('  Needs NWChem 7.x on the PATH (Debian/Ubuntu: apt-get install nwchem) and an MPI launcher.');
	L.push(`  On this machine:   bash run-local.sh           (NPROC=${c.cores} MPI processes per deck; set`);
	L.push('                     NPROC=8 bash run-local.sh to change; as root in a container add');
	L.push('                     MPI_FLAGS=--allow-run-as-root)');
	L.push('  With Slurm:        edit the resources at the top of submit-slurm.sh, then bash submit-slurm.sh');
	L.push('  With PBS:          edit the resources at the top of submit-pbs.sh, then bash submit-pbs.sh');
	L.push('  By hand:           cd into a deck\'s folder and run  mpirun -np 4 nwchem neutral.nw > neutral.out');
	L.push('  Every output must sit beside its deck with the same base name and the extension .out.');
	L.push('  All scripts skip decks whose output is already finished, so they can simply be rerun.', '');

	L.push('HOW TO BRING THE OUTPUTS BACK', '');
	L.push('  Zip this whole folder (decks, outputs and manifest.json; the .movecs and scratch files may be');
	L.push('  left out) and upload the zip on the molecule\'s page in Kappaline. Single .out files can be');
	L.push('  uploaded too. Kappaline shows which scan points or rerun results each file fills, what is');
	L.push('  missing and what failed, and stores nothing until you confirm.', '');

	L.push('CAUTIONS', '');
	L.push('  - Do not reorder the "cam" line: NWChem reads cam, cam_alpha, cam_beta by position and any other');
	L.push('    order silently sets both exact-exchange fractions to 0.');
	L.push('  - NWChem echoes alpha, beta and gamma rounded to 2 decimals; the values in the deck are the ones');
	L.push('    used. Do not rename decks or start names: the outputs are matched by path and start name.');
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
