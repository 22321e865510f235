import { json } from '@sveltejs/kit';
import { openapiDocument } from '$lib/server/openapi';

/** The OpenAPI 3.1 document, generated from the zod schemas the routes validate with. Public. */
export const GET = () => json(openapiDocument());
