/**
 * Physical constants and unit conversions shared by every Kappaline module.
 * Source: CODATA 2018 recommended values (NIST), as listed in the project's science notes, section 1.
 */

/** 1 hartree in eV (CODATA 2018). */
export const HARTREE_EV = 27.211386245988;
/** 1 bohr in Å (CODATA 2018). */
export const BOHR_A = 0.529177210903;
/** e^2/(4 pi eps0) in eV·Å (= 1 hartree × 1 bohr). */
export const COULOMB_EV_A = HARTREE_EV * BOHR_A;
/** 1 bohr^3 in Å^3 (atomic unit of polarizability volume). */
export const BOHR3_A3 = BOHR_A ** 3;
/** Avogadro constant in mol^-1 (exact, SI 2019). */
export const AVOGADRO = 6.02214076e23;
/** Vacuum permittivity in F/m (CODATA 2018). */
export const EPSILON0_F_PER_M = 8.8541878128e-12;

export const hartreeToEv = (eh: number): number => eh * HARTREE_EV;
export const evToHartree = (ev: number): number => ev / HARTREE_EV;
/** gamma in bohr^-1 to Å^-1. */
export const bohrInvToAngInv = (g: number): number => g / BOHR_A;
export const angInvToBohrInv = (g: number): number => g * BOHR_A;
