// `npm run bench`: the science micro-benchmarks, then (when the bootstrap has started the built server
// on a database of its own: APP_URL and DATABASE_URL set) the HTTP load benchmark. Prints a table and
// writes every figure to bench/results/bench-<time>.json and bench/results/latest.json.
// Figures are ratios to baselines measured in the same run; absolute times depend on the machine.
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import type { MicroFigure } from './timing';
import { tuningBench } from './science/tuning-analysis';
import { sweepBench } from './science/levels-sweep';
import { bundleBench } from './science/bundle-build';
import { ingestBench } from './science/output-ingest';
import { loadBench, type LoadFigure } from './http/load';

const only = process.argv[2]; // 'science' or 'http' to run one part
const started = new Date();
const science: MicroFigure[] = [];
let http: LoadFigure[] = [];

const fmt = (n: number | undefined, d = 1) => (n === undefined || Number.isNaN(n) ? '' : n.toFixed(d));
const verdict = (met: boolean | undefined) => (met === undefined ? '' : met ? 'met' : 'NOT met');

if (only !== 'http') {
	console.log('science micro-benchmarks ...');
	science.push(...tuningBench(), ...sweepBench(), ...(await bundleBench()), ...(await ingestBench()));
	console.log('\n| benchmark | median (ms) | runs | x baseline | baseline (ms) | target | |');
	console.log('| --- | ---: | ---: | ---: | ---: | ---: | --- |');
	for (const f of science) console.log(`| ${f.name} | ${fmt(f.medianMs, 3)} | ${f.runs} | ${fmt(f.ratio, 0)} | ${fmt(f.baseline?.medianMs, 4)} | ${f.targetMs !== undefined ? `< ${f.targetMs}` : ''} | ${verdict(f.met)} |`);
}

if (only !== 'science') {
	const base = process.env.APP_URL;
	const dbUrl = process.env.DATABASE_URL;
	if (!base || !dbUrl) {
		console.log('\nHTTP load benchmark skipped: run it through `npm run bench`, which starts the built server on a database of its own.');
	} else {
		console.log(`\nHTTP load against ${base} (autocannon) ...`);
		http = await loadBench(base, dbUrl, Number(process.env.BENCH_SECONDS) || 8);
		console.log('\n| route | conn. | req/s | x health | p50 (ms) | p95 (ms) | p99 (ms) | p95 x health | errors | target p95 | |');
		console.log('| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | --- |');
		for (const f of http) console.log(`| ${f.route} | ${f.connections} | ${fmt(f.requestsPerSecond, 0)} | ${fmt(f.throughputRatio, 2)} | ${fmt(f.p50Ms)} | ${fmt(f.p95Ms)} | ${fmt(f.p99Ms)} | ${fmt(f.p95Ratio, 2)} | ${f.errors} | ${f.p95TargetMs ? `< ${f.p95TargetMs}` : ''} | ${verdict(f.met)} |`);
	}
}

const report = { startedAt: started.toISOString(), node: process.version, cpus: cpus().length, loadAverage: loadavg(), science, http };
mkdirSync(new URL('./results/', import.meta.url), { recursive: true });
const stamp = started.toISOString().replace(/[:.]/g, '-');
for (const name of [`bench-${stamp}.json`, 'latest.json']) writeFileSync(new URL(`./results/${name}`, import.meta.url), JSON.stringify(report, null, 2) + '\n');
console.log(`\nfigures written to bench/results/bench-${stamp}.json (and latest.json); load average at start ${loadavg().map((l) => l.toFixed(2)).join(' ')}`);
const failed = [...science, ...http].filter((f) => f.met === false || ('errors' in f && f.errors > 0));
if (failed.length) console.log(`${failed.length} figure(s) missed their target or had errors: ${failed.map((f) => ('route' in f ? `${f.route} @ ${f.connections}` : f.name)).join('; ')}`);
