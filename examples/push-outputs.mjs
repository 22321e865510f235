#!/usr/bin/env node
// Send finished engine outputs from a cluster job to Kappaline in two steps: upload for a preview, then
// confirm. Dependency-free (Node 20+). Usage:
//
//   KAPPALINE_URL=https://kappaline.example.org KAPPALINE_TOKEN=kl_... \
//   node push-outputs.mjs --workspace WS_ID (--study STUDY_ID | --polymorph POLYMORPH_ID) [--confirm] FILE
//
// FILE is the run bundle zipped with the outputs beside the decks, or one NWChem output (.out).
// Without --confirm the preview is printed and nothing is stored (the upload is kept for an hour; its
// id is printed with the command that confirms it). With --confirm the upload is stored at once unless
// the preview shows conflicts with stored values or failed runs, which are printed instead.
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { parseArgs } from 'node:util';

function fail(message) {
	console.error(`push-outputs: ${message}`);
	process.exit(1);
}

const { values, positionals } = parseArgs({
	allowPositionals: true,
	options: { workspace: { type: 'string' }, study: { type: 'string' }, polymorph: { type: 'string' }, confirm: { type: 'boolean' }, url: { type: 'string' }, token: { type: 'string' } }
});
const base = (values.url ?? process.env.KAPPALINE_URL ?? '').replace(/\/$/, '');
const token = values.token ?? process.env.KAPPALINE_TOKEN;
if (!base || !token || !values.workspace || !!values.study === !!values.polymorph || positionals.length !== 1)
	fail('usage: KAPPALINE_URL=... KAPPALINE_TOKEN=... node push-outputs.mjs --workspace WS_ID (--study ID | --polymorph ID) [--confirm] FILE');

const file = positionals[0];
const path = values.study ? `studies/${values.study}/outputs` : `polymorphs/${values.polymorph}/reruns/outputs`;
const api = `${base}/api/v1/workspaces/${values.workspace}/${path}`;
const headers = { authorization: `Bearer ${token}` };

async function call(method, url, body) {
	const r = await fetch(url, { method, headers: body ? { ...headers, 'content-type': 'application/octet-stream' } : headers, body });
	const json = r.status === 204 ? null : await r.json();
	if (!r.ok) fail(`${method} ${url}: ${r.status} ${json?.error?.message ?? ''}`);
	return json;
}

const preview = await call('POST', `${api}?name=${encodeURIComponent(basename(file))}`, readFileSync(file));
for (const p of preview.scanPoints) console.log(`gamma ${p.point.gammaBohrInv.toFixed(4)} bohr^-1: ${p.status}${p.missing.length ? ` (missing: ${p.missing.join(', ')})` : ''}`);
for (const r of preview.reruns) console.log(`epsilon ${r.epsilon.toFixed(3)}: ${r.status}`);
for (const c of [...preview.scanPoints, ...preview.reruns].flatMap((x) => x.conflicts)) console.log(`  conflict ${c.field}: stored ${c.storedHartree}, uploaded ${c.uploadedHartree} hartree`);
for (const f of preview.failed) console.log(`failed: ${f.file}${f.line ? ` line ${f.line}` : ''}: ${f.message}`);
for (const m of preview.missing) console.log(`missing: ${m.file}`);
const { summary } = preview;
console.log(`upload ${preview.id}: ${summary.toStore} to store, ${summary.alreadyStored} already stored, ${summary.conflicts} in conflict`);

if (!values.confirm) {
	console.log(`nothing stored; to store: curl -X POST -H "Authorization: Bearer $KAPPALINE_TOKEN" ${api}/${preview.id}/confirm`);
} else if (summary.conflicts || preview.failed.length) {
	fail('not confirmed: the preview shows conflicts or failed runs (see above); check them, then confirm the upload id by hand');
} else if (summary.toStore === 0) {
	await call('DELETE', `${api}/${preview.id}`);
	console.log('nothing new to store; the upload was discarded');
} else {
	const done = await call('POST', `${api}/${preview.id}/confirm`);
	console.log(`stored: ${done.inserted} added, ${done.filled} completed, ${done.skipped} skipped`);
}
