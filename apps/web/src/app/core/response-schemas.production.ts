import type { ResponseSchemas } from './response-contracts';

/**
 * Production stands in for `response-schemas.ts` (angular.json, `fileReplacements`): answers are only
 * cast there, as the server built them from the same schemas, so no schema (and no zod) ships.
 */
export const RESPONSE_SCHEMAS: ResponseSchemas | null = null;
