/** Workspace roles, lowest to highest. Shared by server checks and the UI (which hides what a role cannot do). */
export const ROLES = ['viewer', 'editor', 'owner'] as const;
export type Role = (typeof ROLES)[number];

export const roleRank = (r: Role): number => ROLES.indexOf(r);
export const atLeast = (have: Role | null | undefined, need: Role): boolean => !!have && roleRank(have) >= roleRank(need);
export const canEdit = (r: Role | null | undefined): boolean => atLeast(r, 'editor');
export const isOwner = (r: Role | null | undefined): boolean => atLeast(r, 'owner');
