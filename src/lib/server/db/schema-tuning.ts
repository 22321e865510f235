// Tables for tuning studies and scan points. Joined into `Database` in schema.ts.
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface TuningTables {}
