import { OpenAPIRegistry, OpenApiGeneratorV31, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { apiErrorBody } from '$lib/schemas/api';
import type { Role } from '$lib/roles';

export const WS_PARAM = z.object({ ws: z.uuid().meta({ description: 'workspace id' }) });
export const WS_ID_PARAMS = WS_PARAM.extend({ id: z.uuid() });

export interface Operation {
	method: 'get' | 'post' | 'patch' | 'put' | 'delete';
	/** OpenAPI path, e.g. /api/v1/workspaces/{ws}/molecules/{id} */
	path: string;
	summary: string;
	description?: string;
	tag: string;
	/** Least workspace role needed ('user' = any signed-in caller). */
	role: Role | 'user' | 'public';
	params?: z.ZodObject;
	query?: z.ZodObject;
	body?: z.ZodType;
	bodyContentType?: string;
	headers?: z.ZodObject;
	response?: { status: number; description: string; schema?: z.ZodType; contentType?: string };
	/** A copy-paste example request body (JSON), shown in the reference page. */
	example?: unknown;
}

const operations: Operation[] = [];

/** Each feature registers its routes here (see ./index.ts); the document and the reference page read them. */
export function defineOperation(op: Operation): void {
	operations.push(op);
}

export function allOperations(): readonly Operation[] {
	return operations;
}

export function needsText(role: Operation['role']): string {
	if (role === 'public') return 'nothing (public)';
	if (role === 'user') return 'any signed-in caller';
	return `the ${role} role in the workspace`;
}

const errorContent = { 'application/json': { schema: apiErrorBody } };

export function buildDocument(version: string) {
	const registry = new OpenAPIRegistry();
	registry.registerComponent('securitySchemes', 'bearerToken', { type: 'http', scheme: 'bearer', description: 'a personal API token (Settings → API tokens)' });
	registry.registerComponent('securitySchemes', 'sessionCookie', { type: 'apiKey', in: 'cookie', name: 'authjs.session-token' });
	for (const op of operations) {
		const responses: RouteConfig['responses'] = {
			[op.response?.status ?? 200]: op.response?.schema
				? { description: op.response.description, content: { [op.response.contentType ?? 'application/json']: { schema: op.response.schema } } }
				: { description: op.response?.description ?? 'OK' },
			400: { description: 'invalid input: the body names the field or line', content: errorContent },
			401: { description: 'no session and no valid token', content: errorContent },
			403: { description: `the caller's role is below ${op.role}`, content: errorContent },
			404: { description: 'not found, or not in a workspace the caller belongs to', content: errorContent },
			429: { description: 'token rate limit hit; see Retry-After', content: errorContent },
			503: { description: 'the database is unreachable (e.g. restarting); nothing was changed: retry after Retry-After seconds', content: errorContent }
		};
		if (op.method === 'patch' || op.method === 'put' || op.method === 'delete')
			responses[412] = { description: 'If-Match does not match the current version: reload and retry', content: errorContent };
		registry.registerPath({
			method: op.method,
			path: op.path,
			summary: op.summary,
			description: `${op.description ?? ''}\n\nNeeds: ${needsText(op.role)}.`.trim(),
			tags: [op.tag],
			security: op.role === 'public' ? [] : [{ bearerToken: [] }, { sessionCookie: [] }],
			request: {
				params: op.params,
				query: op.query,
				headers: op.headers,
				body: op.body ? { content: { [op.bodyContentType ?? 'application/json']: { schema: op.body } }, required: true } : undefined
			},
			responses
		});
	}
	return new OpenApiGeneratorV31(registry.definitions).generateDocument({
		openapi: '3.1.0',
		info: {
			title: 'Kappaline API',
			version,
			description:
				'JSON API of Kappaline: molecules, polymorphs and their records. Authenticate with a personal token (Authorization: Bearer) or a browser session. Errors share one body shape. Updates take If-Match with the version you read. Results are model estimates: check them against measurement before device decisions.'
		},
		servers: [{ url: '/' }]
	});
}
