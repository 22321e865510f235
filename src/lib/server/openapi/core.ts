import { z } from 'zod';
import { listOf, moleculeOut, polymorphOut, workspaceSummary } from '$lib/schemas/api';
import { moleculeInput, moleculePatch } from '$lib/schemas/molecule';
import { polymorphInput, polymorphPatch } from '$lib/schemas/polymorph';
import { bundleRequest } from '$lib/schemas/bundle';
import { defineOperation, WS_ID_PARAMS, WS_PARAM } from './registry';

const ifMatch = z.object({ 'if-match': z.string().meta({ description: 'the version you read, e.g. "3"' }) });
const listQuery = z.object({
	q: z.string().optional().meta({ description: 'filter by name (substring, case-insensitive)' }),
	limit: z.coerce.number().int().min(1).max(100).optional(),
	cursor: z.string().optional()
});
const exampleXyz = '3\nwater\nO 0.000 0.000 0.117\nH 0.000 0.757 -0.467\nH 0.000 -0.757 -0.467\n';

defineOperation({ method: 'get', path: '/api/v1/workspaces', tag: 'Workspaces', role: 'user', summary: 'List the caller’s workspaces and roles', response: { status: 200, description: 'workspaces', schema: z.object({ items: z.array(workspaceSummary) }) } });

defineOperation({ method: 'get', path: '/api/v1/workspaces/{ws}/molecules', tag: 'Molecules', role: 'viewer', summary: 'List molecules', params: WS_PARAM, query: listQuery.extend({ sort: z.enum(['name', 'formula', 'updated_at']).optional(), dir: z.enum(['asc', 'desc']).optional() }), response: { status: 200, description: 'a page of molecules', schema: listOf(moleculeOut).extend({ total: z.number().int() }) } });
defineOperation({ method: 'post', path: '/api/v1/workspaces/{ws}/molecules', tag: 'Molecules', role: 'editor', summary: 'Create a molecule from an XYZ geometry', params: WS_PARAM, body: moleculeInput, response: { status: 201, description: 'created', schema: moleculeOut }, example: { name: 'Water', netCharge: 0, multiplicity: 1, geometryXyz: exampleXyz } });
defineOperation({ method: 'get', path: '/api/v1/workspaces/{ws}/molecules/{id}', tag: 'Molecules', role: 'viewer', summary: 'Get a molecule (ETag = version)', params: WS_ID_PARAMS, response: { status: 200, description: 'the molecule', schema: moleculeOut } });
defineOperation({ method: 'patch', path: '/api/v1/workspaces/{ws}/molecules/{id}', tag: 'Molecules', role: 'editor', summary: 'Update a molecule', description: 'Send If-Match with the version you read; a stale version gets 412 and nothing is overwritten.', params: WS_ID_PARAMS, headers: ifMatch, body: moleculePatch, response: { status: 200, description: 'updated', schema: moleculeOut }, example: { notes: 'geometry re-optimised at the tuned functional' } });
defineOperation({ method: 'delete', path: '/api/v1/workspaces/{ws}/molecules/{id}', tag: 'Molecules', role: 'editor', summary: 'Delete a molecule to the trash (refused with 409, listing them, while polymorphs or tuning studies remain)', params: WS_ID_PARAMS, response: { status: 204, description: 'deleted' } });

defineOperation({ method: 'get', path: '/api/v1/workspaces/{ws}/polymorphs', tag: 'Polymorphs', role: 'viewer', summary: 'List polymorphs', params: WS_PARAM, query: listQuery.extend({ moleculeId: z.uuid().optional() }), response: { status: 200, description: 'a page of polymorphs', schema: listOf(polymorphOut) } });
defineOperation({ method: 'post', path: '/api/v1/workspaces/{ws}/polymorphs', tag: 'Polymorphs', role: 'editor', summary: 'Add a polymorph to a molecule', params: WS_PARAM, body: polymorphInput.extend({ moleculeId: z.uuid() }), response: { status: 201, description: 'created', schema: polymorphOut }, example: { moleculeId: '<molecule id>', label: 'bulk form I', spaceGroup: 'P2_1/c', a: 8.56, b: 6.04, c: 11.16, alphaDeg: 90, betaDeg: 124.7, gammaDeg: 90, z: 2 } });
defineOperation({ method: 'get', path: '/api/v1/workspaces/{ws}/polymorphs/{id}', tag: 'Polymorphs', role: 'viewer', summary: 'Get a polymorph with its computed volume, V/Z and density', params: WS_ID_PARAMS, response: { status: 200, description: 'the polymorph', schema: polymorphOut } });
defineOperation({ method: 'patch', path: '/api/v1/workspaces/{ws}/polymorphs/{id}', tag: 'Polymorphs', role: 'editor', summary: 'Update a polymorph', params: WS_ID_PARAMS, headers: ifMatch, body: polymorphPatch, response: { status: 200, description: 'updated', schema: polymorphOut } });
defineOperation({ method: 'delete', path: '/api/v1/workspaces/{ws}/polymorphs/{id}', tag: 'Polymorphs', role: 'editor', summary: 'Delete a polymorph to the trash, with its dielectric entries, measurements, reruns and estimates (owners restore)', params: WS_ID_PARAMS, response: { status: 204, description: 'deleted' } });

defineOperation({ method: 'get', path: '/api/v1/openapi.json', tag: 'Reference', role: 'public', summary: 'This document (OpenAPI 3.1)', response: { status: 200, description: 'the OpenAPI document' } });

// Rerun bundles (NWChem decks or Psi4 inputs, cluster scripts, manifest.json with SHA-256 of every file).
defineOperation({ method: 'get', path: '/api/v1/workspaces/{ws}/bundles', tag: 'Bundles', role: 'viewer', summary: 'List rerun bundles made so far (who, when, from what)', params: WS_PARAM, query: z.object({ moleculeId: z.uuid().optional(), polymorphId: z.uuid().optional() }), response: { status: 200, description: 'bundles', schema: z.object({ items: z.array(z.record(z.string(), z.unknown())), nextCursor: z.string().nullable() }) } });
defineOperation({ method: 'post', path: '/api/v1/workspaces/{ws}/bundles', tag: 'Bundles', role: 'editor', summary: 'Build a rerun bundle (zip): tuning-scan decks per gamma and/or screened reruns per epsilon', description: 'Answers the zip; its record id is in the X-Kappaline-Bundle header. engine: nwchem (default) or psi4 (inputs need Psi4 >= 1.4 to set omega; 1.3.2 stops with "set_omega not implemented"). The deck writers refuse, with the reason, parameters the engine would silently get wrong.', params: WS_PARAM, body: bundleRequest, response: { status: 201, description: 'the zip', contentType: 'application/zip', schema: z.string().meta({ format: 'binary' }) }, example: { moleculeId: '<molecule id>', alpha: 0.2, tuningGammas: [0.15, 0.2, 0.25, 0.3], screened: { gammaBohrInv: 0.22, epsilons: [3.2] }, basis: 'aug-cc-pvdz' } });
defineOperation({ method: 'get', path: '/api/v1/workspaces/{ws}/bundles/{id}', tag: 'Bundles', role: 'viewer', summary: 'Download a recorded bundle again (rebuilt and checked against its SHA-256)', params: WS_ID_PARAMS, response: { status: 200, description: 'the zip', contentType: 'application/zip', schema: z.string().meta({ format: 'binary' }) } });
