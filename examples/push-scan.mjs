#!/usr/bin/env node
// Push a range-separation scan from a cluster job to Kappaline and print gamma*.
// Dependency-free (Node 20+). Usage:
//
//   KAPPALINE_URL=https://kappaline.example.org KAPPALINE_TOKEN=kl_... \
//   node push-scan.mjs --workspace WS_ID --study STUDY_ID scan.csv
//
// scan.csv has the canonical header (energies in hartree, gamma in bohr^-1):
//   gamma_bohr_inv,E_N_Ha,E_cation_Ha,E_anion_Ha,eps_homo_N_Ha,eps_lumo_N_Ha,eps_homo_anion_Ha
// The batch is sent with an Idempotency-Key derived from the file, so a retried job adds nothing twice.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';

const COLUMNS = {
	gamma_bohr_inv: 'gammaBohrInv',
	E_N_Ha: 'eNeutralHartree',
	E_cation_Ha: 'eCationHartree',
	E_anion_Ha: 'eAnionHartree',
	eps_homo_N_Ha: 'homoNeutralHartree',
	eps_lumo_N_Ha: 'lumoNeutralHartree',
	eps_homo_anion_Ha: 'homoAnionHartree'
};

function fail(message) {
	console.error(`push-scan: ${message}`);
	process.exit(1);
}

const { values, positionals } = parseArgs({
	allowPositionals: true,
	options: { workspace: { type: 'string' }, study: { type: 'string' }, url: { type: 'string' }, token: { type: 'string' } }
});
const base = (values.url ?? process.env.KAPPALINE_URL ?? '').replace(/\/$/, '');
const token = values.token ?? process.env.KAPPALINE_TOKEN;
if (!base || !token || !values.workspace || !values.study || positionals.length !== 1)
	fail('usage: KAPPALINE_URL=... KAPPALINE_TOKEN=... node push-scan.mjs --workspace WS_ID --study STUDY_ID scan.csv');

const text = readFileSync(positionals[0], 'utf8');
const lines = text.split(/\r?\n/).filter((l) => l.trim() && !l.startsWith('#'));
const header = lines[0].split(',').map((h) => h.trim());
if (!header.includes('gamma_bohr_inv')) fail(`${positionals[0]}: the header must include gamma_bohr_inv (got ${header.join(',')})`);
const points = lines.slice(1).map((line, i) => {
	const cells = line.split(',');
	const point = {};
	header.forEach((h, j) => {
		const key = COLUMNS[h];
		if (!key) return;
		const raw = (cells[j] ?? '').trim();
		const v = raw === '' ? null : Number(raw);
		if (v !== null && !Number.isFinite(v)) fail(`${positionals[0]} line ${i + 2}, column ${h}: "${raw}" is not a number`);
		point[key] = v;
	});
	return point;
});

const api = `${base}/api/v1/workspaces/${values.workspace}/studies/${values.study}`;
const headers = { authorization: `Bearer ${token}`, 'content-type': 'application/json' };
const key = `push-scan-${createHash('sha256').update(text).digest('hex').slice(0, 32)}`;

const push = await fetch(`${api}/points`, { method: 'POST', headers: { ...headers, 'idempotency-key': key }, body: JSON.stringify({ points }) });
const pushed = await push.json();
if (!push.ok) fail(`pushing points failed (${push.status}): ${pushed.error?.message ?? JSON.stringify(pushed)}`);
console.log(pushed.replayed ? `points already pushed earlier (same file): nothing added` : `pushed ${pushed.inserted} points`);

const res = await fetch(`${api}/result`, { headers });
const result = await res.json();
if (!res.ok) fail(`reading the analysis failed (${res.status}): ${result.error?.message ?? JSON.stringify(result)}`);
const opt = result.result?.optimum;
if (!opt) {
	for (const d of result.result?.diagnostics ?? []) console.error(`  ${d.severity}: ${d.message}`);
	fail('no optimum could be found from these points (see the diagnostics above)');
}
console.log(`gamma* = ${opt.gammaBohrInv.toFixed(4)} bohr^-1 (${(opt.gammaBohrInv / 0.529177210903).toFixed(4)} Å^-1)${result.saved ? '' : ' (not yet saved in the study)'}`);
for (const d of result.result.diagnostics ?? []) if (d.severity !== 'info') console.log(`  ${d.severity}: ${d.message}`);
