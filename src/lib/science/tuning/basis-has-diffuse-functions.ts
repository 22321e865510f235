/**
 * Whether a basis-set name says it has diffuse functions, by common naming (common practice, not a
 * look-up in a basis-set library):
 * - Dunning sets with an augmentation prefix: `aug-`, `d-aug-`, `t-aug-`, and the calendar truncations
 *   `jun-`, `jul-`, `may-`, `apr-` of aug-cc-pVXZ (partially augmented, still diffuse);
 * - Pople sets with `+` or `++` before the `G` (`6-31+G*`, `6-311++G(d,p)`);
 * - Karlsruhe sets with a trailing `D` on the size (`def2-SVPD`, `def2-TZVPD`, `def2-QZVPPD`), and the
 *   minimally augmented `ma-` prefix;
 * - Jensen's augmented `aug-pc-n` / `aug-pcseg-n` (covered by `aug-`);
 * - any name containing the word `diffuse`.
 * Returns `true`, `false`, or `null` when the name is empty (nothing to judge).
 */
export function basisHasDiffuseFunctions(basisName: string | null | undefined): boolean | null {
	if (basisName === null || basisName === undefined) return null;
	if (typeof basisName !== 'string') throw new TypeError(`basisName must be a string, got ${typeof basisName}`);
	const name = basisName.trim().toLowerCase();
	if (name === '') return null;
	if (/(^|[^a-z])(aug|[dtq]-aug|jun|jul|may|apr|ma)-/.test(name)) return true;
	if (/\+g/.test(name)) return true; // Pople: 6-31+G, 6-311++G**
	if (/^def2-[a-z]*d$/.test(name.replace(/\(.*\)$/, ''))) return true; // def2-SVPD, def2-TZVPPD
	if (name.includes('diffuse')) return true;
	return false;
}
