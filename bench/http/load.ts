// Load on the built server and its real PostgreSQL with autocannon: throughput and p50/p95/p99
// latency of the molecule list, a polymorph (API and page) and the scan bulk-add API at 10 and 50
// connections, each next to the trivial health endpoint measured in the same run. Latency percentiles
// are computed from every response's own time (autocannon's 'response' event), so p95 is exact.
import autocannon from 'autocannon';
import { createDb } from '../../src/lib/server/db/create-db';
import { signUp } from '../../src/lib/server/services/accounts';
import { createApiToken } from '../../src/lib/server/services/api-tokens';
import { createMolecule } from '../../src/lib/server/services/molecules';
import { createPolymorph } from '../../src/lib/server/services/polymorphs';
import { createStudy } from '../../src/lib/server/services/tuning';
import { syntheticScan } from '../../src/lib/science/tuning/synthetic-scan.testdata';

export interface LoadFigure {
	route: string;
	connections: number;
	seconds: number;
	requests: number;
	requestsPerSecond: number;
	p50Ms: number;
	p95Ms: number;
	p99Ms: number;
	/** Connection errors and timeouts plus answers outside 2xx. */
	errors: number;
	/** Throughput and p95 relative to the health endpoint at the same connection count. */
	throughputRatio?: number;
	p95Ratio?: number;
	p95TargetMs?: number;
	met?: boolean;
}

const WATER = '3\nwater\nO 0.000 0.000 0.117\nH 0.000 0.757 -0.467\nH 0.000 -0.757 -0.467\n';

/** A workspace of its own: 200 molecules with a polymorph each, 50 studies to add points to, a token, a session. */
async function prepare(baseUrl: string, databaseUrl: string) {
	const db = createDb(databaseUrl, { max: 4 });
	try {
		const tag = Date.now().toString(36);
		const email = `bench-${tag}@example.test`;
		const password = 'benchmark-password-1';
		const u = await signUp(db, { email, password, name: 'Benchmark' });
		const actor = { userId: u.userId, workspaceId: u.workspaceId, role: 'owner' as const };
		let molecule = '';
		let polymorph = '';
		for (let i = 0; i < 200; i++) {
			const m = await createMolecule(db, actor, { name: `Bench molecule ${String(i).padStart(3, '0')}`, formula: '', netCharge: 0, multiplicity: 1, geometryXyz: WATER, smiles: '', notes: '' });
			const p = await createPolymorph(db, actor, m.id, { label: 'form I', spaceGroup: 'P2_1/c', a: 7.9, b: 6.0, c: 8.6, alphaDeg: 90, betaDeg: 124.6, gammaDeg: 90, z: 2, temperatureK: 295, structureSource: 'benchmark', notes: '' });
			if (i === 0) [molecule, polymorph] = [m.id, p.id];
		}
		const studies: string[] = [];
		for (let i = 0; i < 50; i++) {
			const s = await createStudy(db, actor, molecule, { name: `bench study ${i}`, engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'def2-SVP', alpha: 0.2, objective: 'abs-sum', notes: '' });
			studies.push(s.id);
		}
		const token = (await createApiToken(db, u.userId, { workspaceId: u.workspaceId, name: 'benchmark', role: 'editor', expiresInDays: 1 })).token;
		const r = await fetch(`${baseUrl}/auth/callback/credentials`, {
			method: 'POST',
			redirect: 'manual',
			headers: { 'content-type': 'application/x-www-form-urlencoded', origin: baseUrl },
			body: new URLSearchParams({ email, password, callbackUrl: '/' })
		});
		const cookie = r.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
		if (!cookie.includes('session-token=')) throw new Error(`benchmark sign-in failed (${r.status})`);
		return { ws: u.workspaceId, molecule, polymorph, studies, token, cookie };
	} finally {
		await db.destroy();
	}
}

function percentile(sorted: number[], p: number): number {
	if (!sorted.length) return NaN;
	return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

async function measure(name: string, opts: autocannon.Options): Promise<LoadFigure> {
	const times: number[] = [];
	let bad = 0;
	// Without a callback autocannon returns its event-emitting instance, which is also a promise of the result.
	const instance = autocannon({ ...opts, timeout: 10 }) as unknown as autocannon.Instance & Promise<autocannon.Result>;
	instance.on('response', (_client: unknown, status: number, _bytes: number, ms: number) => {
		times.push(ms);
		if (status < 200 || status >= 300) bad++;
	});
	const result = await instance;
	times.sort((a, b) => a - b);
	const seconds = result.duration;
	return {
		route: name,
		connections: opts.connections!,
		seconds,
		requests: times.length,
		requestsPerSecond: times.length / seconds,
		p50Ms: percentile(times, 50),
		p95Ms: percentile(times, 95),
		p99Ms: percentile(times, 99),
		errors: result.errors + result.timeouts + bad
	};
}

/** Runs every route at 10 and 50 connections for `seconds` each; returns one figure per route and load. */
export async function loadBench(baseUrl: string, databaseUrl: string, seconds = 8): Promise<LoadFigure[]> {
	const fx = await prepare(baseUrl, databaseUrl);
	const api = `${baseUrl}/api/v1/workspaces/${fx.ws}`;
	const bearer = { authorization: `Bearer ${fx.token}` };
	let counter = 0;
	const routes: { name: string; url: string; p95TargetMs?: number; options?: Partial<autocannon.Options> }[] = [
		{ name: 'GET /healthz (baseline)', url: `${baseUrl}/healthz` },
		{ name: 'GET molecule list (API, 200 molecules, first page)', url: `${api}/molecules`, p95TargetMs: 50, options: { headers: bearer } },
		{ name: 'GET polymorph (API)', url: `${api}/polymorphs/${fx.polymorph}`, p95TargetMs: 50, options: { headers: bearer } },
		{ name: 'GET polymorph page (HTML, session)', url: `${baseUrl}/w/${fx.ws}/polymorphs/${fx.polymorph}`, options: { headers: { cookie: fx.cookie } } },
		{
			name: 'POST scan bulk-add (API, 10 points, 50 studies)',
			url: `${api}/studies/${fx.studies[0]}/points`,
			options: {
				method: 'POST',
				headers: { ...bearer, 'content-type': 'application/json' },
				requests: [
					{
						setupRequest: (req) => {
							// Fresh gammas every request (a study refuses a gamma twice), spread over 50 studies.
							const n = counter++;
							const study = fx.studies[n % fx.studies.length];
							const base = 0.05 + Math.floor(n / fx.studies.length) * 0.01;
							const points = syntheticScan(Array.from({ length: 10 }, (_, k) => Number((base + k * 0.001).toFixed(6))));
							return { ...req, path: `/api/v1/workspaces/${fx.ws}/studies/${study}/points`, body: JSON.stringify({ points }) };
						}
					}
				]
			}
		}
	];
	const out: LoadFigure[] = [];
	for (const connections of [10, 50]) {
		let health: LoadFigure | undefined;
		for (const r of routes) {
			await measure(r.name, { url: r.url, connections, duration: 1, ...r.options }); // warm-up
			const f = await measure(r.name, { url: r.url, connections, duration: seconds, ...r.options });
			if (!health) health = f;
			else {
				f.throughputRatio = f.requestsPerSecond / health.requestsPerSecond;
				f.p95Ratio = f.p95Ms / health.p95Ms;
			}
			if (r.p95TargetMs && connections === 50) Object.assign(f, { p95TargetMs: r.p95TargetMs, met: f.p95Ms < r.p95TargetMs && f.errors === 0 });
			out.push(f);
			console.log(`  ${r.name} @ ${connections}: ${f.requestsPerSecond.toFixed(0)} req/s, p95 ${f.p95Ms.toFixed(1)} ms, errors ${f.errors}`);
		}
	}
	return out;
}
