import {
  branchOverviewSchema,
  branchSchema,
  comparisonSchema,
  draftSchema,
  importStudyResultSchema,
  jobSchema,
  memberSchema,
  projectSchema,
  restoreResultSchema,
  studyHistorySchema,
  studySchema,
  uploadResponseSchema,
  versionDetailSchema,
  versionSummarySchema,
} from '@laminote/contracts';
import type { ResponseSchemas } from './response-contracts';

/**
 * The contract schema of each answer `checked` parses, in development builds and unit tests. The
 * production build replaces this file with `response-schemas.production.ts` (angular.json,
 * `fileReplacements`), so zod and the schemas are not shipped where they would only be cast.
 */
export const RESPONSE_SCHEMAS: ResponseSchemas | null = {
  branches: branchSchema.array(),
  draft: draftSchema,
  uploadedTable: uploadResponseSchema,
  job: jobSchema,
  studies: studySchema.array(),
  study: studySchema,
  importedStudy: importStudyResultSchema,
  projects: projectSchema.array(),
  project: projectSchema,
  members: memberSchema.array(),
  member: memberSchema,
  studyHistory: studyHistorySchema,
  versionDetail: versionDetailSchema,
  versionSummary: versionSummarySchema,
  restoreResult: restoreResultSchema,
  branchOverview: branchOverviewSchema,
  comparison: comparisonSchema,
};
