// Tables for solid-state estimates and measurements. Joined into `Database` in schema.ts.
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface LevelsTables {}
