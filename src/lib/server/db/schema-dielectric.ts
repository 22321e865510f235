// Tables for CIF files and dielectric entries. Joined into `Database` in schema.ts.
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface DielectricTables {}
