/** Caveats shown beside every polarization-based estimate (science notes, section 6, reworded). */
export const CAUTIONS =
	'These numbers are model estimates, meant for planning and for comparing methods. They leave out band ' +
	'dispersion, the relaxation of molecules and lattice around a charge (vibrational and geometric), and ' +
	'disorder. The surface and buried interfaces of a film screen a charge differently from the bulk crystal. ' +
	'Compare with measured levels (photoemission for the IP, inverse photoemission for the EA) before basing ' +
	'device decisions on them.';
