import { discardRoute } from '$lib/server/upload-routes';

/** Discard a pending upload of outputs (nothing of it is stored). */
export const DELETE = discardRoute('polymorph');
