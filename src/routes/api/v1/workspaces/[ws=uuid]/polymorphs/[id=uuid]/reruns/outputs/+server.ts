import { previewRoute } from '$lib/server/upload-routes';

/** Upload screened-rerun outputs (a bundle zip, NWChem outputs, or a folder's files as multipart): answers with the preview and an upload id; nothing is stored until .../{upload}/confirm. */
export const POST = previewRoute('polymorph');
