// Seeds the demo workspace when the database has no users yet. Run by `npm start`.
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { createDb, type Executor } from '../src/lib/server/db/create-db';
import { signUp } from '../src/lib/server/services/accounts';
import { createMolecule } from '../src/lib/server/services/molecules';
import { createPolymorph } from '../src/lib/server/services/polymorphs';
import { addDielectricEntry, chooseEpsilon } from '../src/lib/server/services/dielectric';
import { dielectricEntryInput } from '../src/lib/schemas/dielectric';
import { DEMO_EPSILON, DEMO_TUNING, demoMolecules, demoScan } from './demo-data';
import { createStudy, importPoints, markCurrent, saveAnalysis } from '../src/lib/server/services/tuning';

export async function seedDemo(db: Executor, creds: { email: string; password: string; viewerEmail: string; viewerPassword: string }): Promise<string> {
	const owner = await signUp(db, { email: creds.email, password: creds.password, name: 'Demo Researcher' });
	const viewer = await signUp(db, { email: creds.viewerEmail, password: creds.viewerPassword, name: 'Demo Collaborator (experiment)' });
	// The demo users' personal workspaces become (owner) or give way to (collaborator) the demo workspace,
	// so both land in it after signing in.
	const wsId = owner.workspaceId;
	await db.updateTable('workspace').set({ name: 'Fjordlight Photonics — acene screening (demo)', is_demo: true }).where('id', '=', wsId).execute();
	await db.deleteFrom('workspace').where('id', '=', viewer.workspaceId).execute();
	await db.insertInto('membership').values({ workspace_id: wsId, user_id: viewer.userId, role: 'viewer' }).execute();
	const actor = { userId: owner.userId, workspaceId: wsId, role: 'owner' as const };
	for (const d of demoMolecules()) {
		const m = await createMolecule(db, actor, d.molecule);
		const model = DEMO_TUNING[d.molecule.name];
		if (model) {
			const study = await createStudy(db, actor, m.id, { name: 'α 0.2, aug-cc-pVDZ (demo scan)', engine: 'NWChem', engineVersion: '7.0.2', semilocalBase: 'PBE', basisSet: 'aug-cc-pVDZ', alpha: 0.2, objective: 'abs-sum', notes: 'Invented demo scan generated from a model, not an engine run.' });
			const imported = await importPoints(db, actor, study.id, demoScan(model), { source: 'the demo seed' });
			const saved = await saveAnalysis(db, actor, study.id, imported.study.version, { objective: 'abs-sum' });
			await markCurrent(db, actor, study.id, saved.version);
		}
		for (const p of d.polymorphs) {
			const poly = await createPolymorph(db, actor, m.id, p);
			const eps = DEMO_EPSILON[p.label];
			if (eps === undefined) continue;
			const scalar = await addDielectricEntry(db, actor, poly.id, dielectricEntryInput.parse({ kind: 'scalar', frequency: 'electronic', epsilon: eps, epsilonUncertainty: 0.2, method: 'demo value (invented)', note: 'Invented for the demo workspace.' }));
			if (p.label === 'bulk (demo)')
				await addDielectricEntry(db, actor, poly.id, dielectricEntryInput.parse({ kind: 'tensor', frequency: 'electronic', tensor: [[eps - 0.5, 0.05, 0], [0.05, eps - 0.2, 0.1], [0, 0.1, eps + 0.7]], method: 'invented linear-response tensor (demo)' }));
			await chooseEpsilon(db, actor, poly.id, { entryId: scalar.id, reason: 'demo: electronic constant used for all screened reruns', version: undefined });
		}
	}
	return wsId;
}

async function main() {
	const url = process.env.DATABASE_URL;
	if (!url) throw new Error('DATABASE_URL is not set');
	const db = createDb(url, { max: 2 });
	try {
		const users = await db.selectFrom('User').select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
		if (Number(users.n) > 0) {
			console.log('seed: database already has users, leaving it as it is');
			return;
		}
		const creds = JSON.parse(readFileSync(new URL('./demo-credentials.json', import.meta.url), 'utf8'));
		// One transaction: a failed seed leaves the database empty, and the next start tries again.
		await db.transaction().execute((tx) => seedDemo(tx, creds));
		console.log('seed: demo workspace created');
	} finally {
		await db.destroy();
	}
}

if (import.meta.url === pathToFileURL(process.argv[1]).href) {
	main().catch((e) => {
		console.error(e);
		process.exit(1);
	});
}
