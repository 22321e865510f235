import { json, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from './authz';
import { db } from './db';
import { api, formFailure, formFiles, readUploadFiles } from './http';
import { confirmUpload, discardUpload, previewUpload, type UploadTargetKind } from './services/output-uploads';

/**
 * The /api/v1 handlers and page form actions of output uploads, shared by the study (scan points) and polymorph (screened
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

/**
 * The same three steps as form actions of the study and levels pages (the page names them). Failures
 * carry `_section`, so the page shows them beside its upload block.
 */
export function uploadFormActions(kind: UploadTargetKind, section: string) {
	const fields = async (event: RequestEvent) => Object.fromEntries(await event.request.formData()) as Record<string, string>;
	const formUploadId = (values: Record<string, string>) => z.uuid('not a valid upload id').parse(values.upload);
	return {
		preview: async (event: RequestEvent) => {
			const actor = await requireRole(event, event.params.ws!, 'editor');
			try {
				const files = await formFiles(await event.request.formData(), 'outputs');
				return { upload: await previewUpload(db(), actor, target(kind, event), files) };
			} catch (e) {
				return formFailure(e, { _section: section });
			}
		},
		confirm: async (event: RequestEvent) => {
			const actor = await requireRole(event, event.params.ws!, 'editor');
			const values = await fields(event);
			try {
				const r = await confirmUpload(db(), actor, target(kind, event), formUploadId(values));
				return { ingested: { inserted: r.inserted, filled: r.filled, skipped: r.skipped } };
			} catch (e) {
				return formFailure(e, { ...values, _section: section });
			}
		},
		discard: async (event: RequestEvent) => {
			const actor = await requireRole(event, event.params.ws!, 'editor');
			const values = await fields(event);
			try {
				await discardUpload(db(), actor, target(kind, event), formUploadId(values));
				return { discarded: true };
			} catch (e) {
				return formFailure(e, { ...values, _section: section });
			}
		}
	};
}
