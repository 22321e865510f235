import { allOperations, needsText } from '$lib/server/openapi/registry';
import { openapiDocument } from '$lib/server/openapi';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const doc = openapiDocument();
	const origin = url.origin;
	const operations = allOperations().map((op) => {
		const body = op.example === undefined ? '' : ` \\\n  -H 'content-type: application/json' -d '${JSON.stringify(op.example)}'`;
		const ifMatch = op.method === 'patch' ? ` \\\n  -H 'If-Match: "1"'` : '';
		const auth = op.role === 'public' ? '' : ` \\\n  -H "Authorization: Bearer $KAPPALINE_TOKEN"`;
		const path = op.path.replace('{ws}', '$WS').replace('{id}', '$ID');
		const operation = (doc.paths?.[op.path] as Record<string, { requestBody?: unknown; parameters?: unknown[] }> | undefined)?.[op.method];
		return {
			id: `${op.method}-${op.path}`.replace(/[^\w]+/g, '-'),
			method: op.method.toUpperCase(),
			path: op.path,
			tag: op.tag,
			summary: op.summary,
			description: op.description ?? '',
			needs: needsText(op.role),
			parameters: ((operation?.parameters ?? []) as { name: string; in: string; description?: string; required?: boolean }[]).map((p) => ({ name: p.name, in: p.in, description: p.description ?? '', required: !!p.required })),
			requestSchema: operation?.requestBody ? JSON.stringify((operation.requestBody as { content: Record<string, { schema: unknown }> }).content, null, 2) : '',
			curl: `curl -s -X ${op.method.toUpperCase()} "${origin}${path}"${auth}${ifMatch}${body}`
		};
	});
	return { operations, version: doc.info.version };
};
