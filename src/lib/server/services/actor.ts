import type { Role } from '$lib/roles';

/** Who is acting, in which workspace, with which role (already checked by the caller). */
export interface Actor {
	userId: string;
	workspaceId: string;
	role: Role;
}
