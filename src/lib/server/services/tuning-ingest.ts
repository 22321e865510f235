import type { IngestProblem } from '$lib/formats/bundle';
import type { Executor } from '../db';
import { ValidationError } from '../errors';
import type { Actor } from './actor';
import { readOutputs } from './reruns';
import { importPoints } from './tuning';

/**
 * Reads the outputs of a tuning-scan bundle (a zip with outputs beside the decks, or single NWChem
 * outputs) and adds the scan points they give to the study, all or nothing. Archives are checked
 * first (size, entry count, compression ratio, paths, links, nested archives).
 */
export async function ingestScanOutputs(
	db: Executor,
	actor: Actor,
	studyId: string,
	fileName: string,
	bytes: Uint8Array,
	opts: { idempotencyKey?: string } = {}
): Promise<{ inserted: number; replayed: boolean; problems: IngestProblem[] }> {
	const result = await readOutputs(fileName, bytes);
	if (!result.scanPoints.length) {
		const why = result.problems.map((p) => `${p.file}: ${p.message}`).slice(0, 5).join('; ');
		throw new ValidationError(`no tuning-scan result found in ${fileName}${why ? ` (${why})` : ''}`, 'file');
	}
	const r = await importPoints(db, actor, studyId, result.scanPoints.map((p) => ({ ...p, excluded: false })), { idempotencyKey: opts.idempotencyKey, source: `engine outputs (${fileName})` });
	return { inserted: r.inserted, replayed: r.replayed, problems: result.problems };
}
