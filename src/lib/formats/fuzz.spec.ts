// Hostile input, fuzzed with fast-check (property-based testing): random and mutated inputs either parse
// or raise the parser's own error type; they never crash with another error, never hang (each run is
// bounded by the test timeout), and never return NaN in a parsed number.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CifParseError, parseCif, polymorphFromCif } from './cif';
import { ManifestError, readManifest } from './bundle';
import { EngineOutputError, readNwchemOutput, readPsi4Output } from './decks';
import { ScanTableError, parseScanPoints } from './scan-table';
import { TensorParseError, parseDielectricTensor } from './tensor';
import { XyzParseError, parseXyz } from './xyz';
import { TuningInputError } from '$lib/science/tuning';
import cifFixture from './fixtures/cod-2205750.cif?raw';
import xyzFixture from './fixtures/anthracene.xyz?raw';
import scanFixture from './fixtures/scan-comma-hartree.csv?raw';
import outFixture from './decks/fixtures/water_pbe0_reference.out?raw';
import psi4Fixture from './decks/fixtures/psi4_water_tuning_g0p1100.out?raw';
import { FormulaError } from '$lib/science/elements';

const RUNS = { numRuns: 300 };

/** Mutations of a real file: deletions, duplications and replacements of random slices. */
const mutated = (text: string) =>
	fc.array(fc.tuple(fc.nat(text.length), fc.nat(40), fc.string({ maxLength: 12 })), { maxLength: 6 }).map((edits) => {
		let t = text;
		for (const [at, len, ins] of edits) t = t.slice(0, at % (t.length + 1)) + ins + t.slice((at % (t.length + 1)) + len);
		return t;
	});
const anyText = fc.oneof(fc.string({ maxLength: 400 }), fc.string({ unit: 'grapheme', maxLength: 200 }), fc.array(fc.constantFrom('1', '2', '.', '-', 'e', ' ', '\n', ',', '\t', 'C', 'H', '#', 'loop_', '_cell_length_a', ';', "'", '"', 'data_x', '(', ')'), { maxLength: 300 }).map((a) => a.join('')));

function noNaN(value: unknown, path = 'result'): void {
	if (typeof value === 'number') expect(Number.isNaN(value), `${path} is NaN`).toBe(false);
	else if (Array.isArray(value)) value.forEach((v, i) => noNaN(v, `${path}[${i}]`));
	else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) noNaN(v, `${path}.${k}`);
}

function parsesOrOwnError(fn: () => unknown, ...errors: (new (...args: never[]) => Error)[]) {
	try {
		noNaN(fn());
	} catch (e) {
		if (!errors.some((E) => e instanceof E)) throw e;
	}
}

describe('parsers under random and mutated input', () => {
	it('XYZ', () => fc.assert(fc.property(fc.oneof(anyText, mutated(xyzFixture)), (t) => parsesOrOwnError(() => parseXyz(t), XyzParseError)), RUNS));
	it('CIF (reader and polymorph extraction)', () =>
		fc.assert(
			fc.property(fc.oneof(anyText, mutated(cifFixture)), (t) => {
				parsesOrOwnError(() => parseCif(t), CifParseError);
				parsesOrOwnError(() => polymorphFromCif(t), CifParseError, RangeError, FormulaError);
			}),
			RUNS
		));
	it('dielectric tensors', () => fc.assert(fc.property(fc.oneof(anyText, mutated('3.1 0.05 0\n0.05 2.8 0.1\n0 0.1 4.2\n'), mutated('{"xx":3,"yy":3,"zz":4,"xy":0.1}')), (t) => parsesOrOwnError(() => parseDielectricTensor(t), TensorParseError)), RUNS));
	it('scan tables', () => fc.assert(fc.property(fc.oneof(anyText, mutated(scanFixture)), (t) => parsesOrOwnError(() => parseScanPoints(t, { energyUnit: 'hartree' }), ScanTableError, TuningInputError)), RUNS));
	it('NWChem outputs', () => fc.assert(fc.property(fc.oneof(anyText, mutated(outFixture)), (t) => parsesOrOwnError(() => readNwchemOutput(t), EngineOutputError)), { numRuns: 100 }));
	it('Psi4 outputs', () => fc.assert(fc.property(fc.oneof(anyText, mutated(psi4Fixture)), (t) => parsesOrOwnError(() => readPsi4Output(t), EngineOutputError)), { numRuns: 100 }));
	it('bundle manifests (any JSON value)', () => fc.assert(fc.property(fc.jsonValue(), (v) => parsesOrOwnError(() => readManifest(v), ManifestError)), RUNS));
});
