import { fail, isHttpError, isRedirect, json, type ActionFailure, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { MAX_UPLOAD_BYTES } from '$lib/upload-limits';
import { DependentsError, NotFoundError, StaleVersionError, UploadStateError, ValidationError, type DependentLink } from './errors';

/** The JSON error body every /api/v1 route uses. */
export interface ApiErrorBody {
	error: { type: string; message: string; field?: string; line?: number; fields?: Record<string, string[]>; dependents?: string[] };
}

export function apiError(status: number, type: string, message: string, extra: Partial<ApiErrorBody['error']> = {}): Response {
	return json({ error: { type, message, ...extra } } satisfies ApiErrorBody, { status });
}

/** Maps domain errors to HTTP: one rule for every API handler. */
export function errorResponse(e: unknown): Response {
	if (e instanceof z.ZodError) {
		const fields = z.flattenError(e).fieldErrors as Record<string, string[]>;
		const [field] = Object.keys(fields);
		return apiError(400, 'validation', field ? `${field}: ${fields[field]?.[0]}` : e.issues[0]?.message ?? 'invalid input', { field, fields });
	}
	if (e instanceof ValidationError) return apiError(400, 'validation', e.message, { field: e.field, line: e.line });
	if (e instanceof StaleVersionError) return apiError(412, 'stale_version', e.message);
	if (e instanceof NotFoundError) return apiError(404, 'not_found', e.message);
	if (e instanceof DependentsError) return apiError(409, 'has_dependents', e.message, { dependents: e.dependents });
	if (e instanceof UploadStateError) return apiError(e.status, e.status === 410 ? 'expired' : 'conflict', e.message);
	if (isHttpError(e)) {
		const type = { 400: 'bad_request', 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found', 413: 'too_large', 429: 'rate_limited' }[e.status] ?? 'error';
		return apiError(e.status, type, e.body.message);
	}
	throw e;
}

/** Wraps an API handler so thrown errors become consistent JSON bodies. */
export function api(fn: (event: RequestEvent) => Promise<Response>) {
	return async (event: RequestEvent): Promise<Response> => {
		try {
			return await fn(event);
		} catch (e) {
			if (isRedirect(e)) throw e;
			return errorResponse(e);
		}
	};
}

/** Reads a JSON body with a size limit and a clear message when it is not JSON. */
export async function readJson(event: RequestEvent, maxBytes = 2_000_000): Promise<unknown> {
	const text = await event.request.text();
	if (text.length > maxBytes) throw new ValidationError(`request body is larger than the limit of ${maxBytes} bytes`);
	try {
		return JSON.parse(text);
	} catch {
		throw new ValidationError('request body is not valid JSON');
	}
}

/** The version a client read, from `If-Match: "N"` (API) or a form field. */
export function expectedVersion(event: RequestEvent, bodyVersion?: unknown): number {
	const header = event.request.headers.get('if-match');
	const raw = header ? header.replace(/^W\//, '').replace(/"/g, '') : bodyVersion;
	const n = Number(raw);
	if (!Number.isInteger(n) || n < 1) throw new ValidationError('send the version you read (If-Match header or "version" field) so a stale update cannot overwrite newer data', 'version');
	return n;
}

/** Domain errors in form actions become fail() with a message (and field) the page shows. */
export function formFailure<T extends Record<string, unknown>>(e: unknown, values: T): ActionFailure<{ values: T; message: string; errors: Record<string, string[]>; dependents?: DependentLink[] }> {
	if (e instanceof z.ZodError) {
		return fail(400, { values, message: 'Please correct the marked fields.', errors: z.flattenError(e).fieldErrors as Record<string, string[]> });
	}
	if (e instanceof ValidationError) {
		const msg = e.line ? `line ${e.line}: ${e.message.replace(/^line \d+: /, '')}` : e.message;
		return fail(400, { values, message: msg, errors: e.field ? { [e.field]: [msg] } : {} });
	}
	if (e instanceof StaleVersionError) return fail(409, { values, message: e.message, errors: {} });
	if (e instanceof DependentsError) return fail(409, { values, message: `${e.message}: ${e.dependents.join(', ')}`, errors: {}, dependents: e.links });
	if (e instanceof NotFoundError) return fail(404, { values, message: e.message, errors: {} });
	if (e instanceof UploadStateError) return fail(e.status, { values, message: e.message, errors: {} });
	throw e;
}

/** Largest raw upload (engine outputs, bundle zips) the API takes. */
export { MAX_UPLOAD_BYTES };

/** A raw-body upload: its bytes and a file name (?name=, or guessed from the content type), size-checked. */
export async function readUpload(event: RequestEvent): Promise<{ name: string; bytes: Uint8Array }> {
	const name = event.url.searchParams.get('name') ?? (event.request.headers.get('content-type')?.includes('zip') ? 'outputs.zip' : 'output.out');
	const bytes = new Uint8Array(await event.request.arrayBuffer());
	if (bytes.length === 0) throw new ValidationError('the upload is empty', 'body');
	if (bytes.length > MAX_UPLOAD_BYTES) throw new ValidationError(`the upload is over the limit of ${MAX_UPLOAD_BYTES / 1e6} MB`, 'body');
	return { name, bytes };
}

/**
 * Uploaded files of an API call: every file part of a multipart/form-data body, or the raw body as
 * one file (see {@link readUpload}); the total is size-checked.
 */
export async function readUploadFiles(event: RequestEvent): Promise<{ name: string; bytes: Uint8Array }[]> {
	if (!event.request.headers.get('content-type')?.startsWith('multipart/form-data')) return [await readUpload(event)];
	return formFiles(await event.request.formData(), null, 'body');
}

/** The files of a form (all fields, or one named field), non-empty and within {@link MAX_UPLOAD_BYTES} together. */
export async function formFiles(form: FormData, field: string | null, errorField = field ?? 'body'): Promise<{ name: string; bytes: Uint8Array }[]> {
	const files = [...(field ? form.getAll(field) : [...form.values()])].filter((v): v is File => v instanceof File && v.size > 0);
	if (!files.length) throw new ValidationError('choose NWChem outputs (.out) or the bundle zip with the outputs beside the decks', errorField);
	const total = files.reduce((s, f) => s + f.size, 0);
	if (total > MAX_UPLOAD_BYTES) throw new ValidationError(`the upload is ${(total / 1e6).toFixed(1)} MB, over the limit of ${MAX_UPLOAD_BYTES / 1e6} MB`, errorField);
	return Promise.all(files.map(async (f) => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) })));
}
