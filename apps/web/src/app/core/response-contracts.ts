import type {
  Branch,
  BranchOverview,
  Comparison,
  Draft,
  ImportStudyResult,
  Job,
  Member,
  Project,
  RestoreResult,
  Study,
  StudyHistory,
  UploadResponse,
  VersionDetail,
  VersionSummary,
} from '@laminote/contracts';
import type { z } from 'zod';

/** Each API answer the web app checks (`checked`), by name, with the type its contract gives it. */
export interface ResponseContracts {
  branches: Branch[];
  draft: Draft;
  uploadedTable: UploadResponse;
  job: Job;
  studies: Study[];
  study: Study;
  importedStudy: ImportStudyResult;
  projects: Project[];
  project: Project;
  members: Member[];
  member: Member;
  studyHistory: StudyHistory;
  versionDetail: VersionDetail;
  versionSummary: VersionSummary;
  restoreResult: RestoreResult;
  branchOverview: BranchOverview;
  comparison: Comparison;
}

export type ResponseName = keyof ResponseContracts;

/** The schema of each answer: present in development builds and unit tests, absent in production. */
export type ResponseSchemas = { readonly [K in ResponseName]: z.ZodType<ResponseContracts[K]> };
