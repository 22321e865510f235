// Tables for API tokens and idempotency keys. Joined into `Database` in schema.ts.
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface ApiTables {}
