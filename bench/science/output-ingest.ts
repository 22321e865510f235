// Reading engine outputs back: 300 real NWChem 7.0.2 outputs (the committed fixture runs, cycled:
// tuning triples of SO2 and screened water/SO2 runs, 21-171 kB each), first parsed one by one, then
// as one uploaded zip through the whole ingestion (unzip with limits, engine detection, state matching,
// scan points). Baseline in the same run: splitting the same texts into lines. Target: < 2 s for 300.
import { readFileSync, readdirSync } from 'node:fs';
import JSZip from 'jszip';
import { figure, time, timeAsync, type MicroFigure } from '../timing';
import { readNwchemOutput } from '../../src/lib/formats/decks';
import { ingestOutputs } from '../../src/lib/formats/bundle';

const DIR = new URL('../../src/lib/formats/decks/fixtures/', import.meta.url);

export async function ingestBench(): Promise<MicroFigure[]> {
	const real = readdirSync(DIR)
		.filter((f) => /^(so2_g0p\d+|so2_g0p3000_e3p0000|series_water_\w+|water_negative_beta|water_pbe0_limit)\.out$/.test(f))
		.map((f) => ({ name: f, text: readFileSync(new URL(f, DIR), 'utf8') }));
	const N = 300;
	const files = Array.from({ length: N }, (_, i) => ({ name: `run${String(i).padStart(3, '0')}/${real[i % real.length].name}`, text: real[i % real.length].text }));
	const megabytes = files.reduce((n, f) => n + f.text.length, 0) / 1e6;
	const zip = new JSZip();
	for (const f of files) zip.file(f.name, f.text);
	const zipped = await zip.generateAsync({ type: 'uint8array', compression: 'DEFLATE' });
	const check = await ingestOutputs(zipped);
	if (check.tuning.length === 0 || check.screened.length === 0) throw new Error('ingestion benchmark read no results: the fixtures changed?');
	const base = { name: `splitting ${N} outputs (${megabytes.toFixed(1)} MB) into lines`, ...time(() => files.reduce((n, f) => n + f.text.split('\n').length, 0)) };
	return [
		figure(`parse ${N} NWChem outputs (${megabytes.toFixed(1)} MB)`, time(() => files.map((f) => readNwchemOutput(f.text))), { baseline: base, targetMs: 2000 }),
		figure(`ingest one zip of ${N} outputs (${(zipped.length / 1e6).toFixed(1)} MB zipped)`, await timeAsync(() => ingestOutputs(zipped), 1000, 3), { baseline: base, targetMs: 2000 })
	];
}
