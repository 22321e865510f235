import { json, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from './authz';
import { db } from './db';
import { api, readUploadFiles } from './http';
import { confirmUpload, discardUpload, previewUpload, type UploadTargetKind } from './services/output-uploads';

/**
 * The /api/v1 handlers of output uploads, shared by the study (scan points) and polymorph (screened
 * reruns) routes: POST the outputs for a preview (nothing stored), POST .../{upload}/confirm to store,
 * DELETE .../{upload} to discard. Each checks the editor role itself.
 */
const target = (kind: UploadTargetKind, event: RequestEvent) => ({ kind, id: event.params.id! });
const uploadId = (event: RequestEvent) => z.uuid('not a valid upload id').parse(event.params.upload);

export const previewRoute = (kind: UploadTargetKind) =>
	api(async (event) => {
		const actor = await requireRole(event, event.params.ws!, 'editor');
		const preview = await previewUpload(db(), actor, target(kind, event), await readUploadFiles(event));
		return json(preview, { status: 201, headers: { location: `${event.url.pathname}/${preview.id}` } });
	});

export const confirmRoute = (kind: UploadTargetKind) =>
	api(async (event) => {
		const actor = await requireRole(event, event.params.ws!, 'editor');
		return json(await confirmUpload(db(), actor, target(kind, event), uploadId(event)));
	});

export const discardRoute = (kind: UploadTargetKind) =>
	api(async (event) => {
		const actor = await requireRole(event, event.params.ws!, 'editor');
		await discardUpload(db(), actor, target(kind, event), uploadId(event));
		return new Response(null, { status: 204 });
	});
