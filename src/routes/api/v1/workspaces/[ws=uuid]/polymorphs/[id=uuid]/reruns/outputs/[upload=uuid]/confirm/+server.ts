import { confirmRoute } from '$lib/server/upload-routes';

/** Store a pending upload of outputs in one transaction (conflicts checked again). */
export const POST = confirmRoute('polymorph');
