import type {
  BranchOverview,
  Comparison,
  CommentRevision,
  CreatedToken,
  Draft,
  Inbox,
  ImportStudyResult,
  Job,
  Logout,
  Me,
  Member,
  NotificationPrefs,
  Project,
  RestoreResult,
  RunQueued,
  RunResponse,
  Study,
  StudyHistory,
  StudyOpening,
  StudyReview,
  Thread,
  TokenSummary,
  UnreadCount,
  UploadResponse,
  ValidationReport,
  VersionDetail,
  VersionReviewDetail,
  VersionSummary,
} from '@laminote/contracts';
import type { z } from 'zod';

/** Each API answer the web app checks (`checked`), by name, with the type its contract gives it. */
export interface ResponseContracts {
  draft: Draft;
  uploadedTable: UploadResponse;
  job: Job;
  studies: Study[];
  study: Study;
  studyOpening: StudyOpening;
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
  runAnswer: RunResponse | RunQueued;
  me: Me;
  signedOut: Logout;
  threads: Thread[];
  thread: Thread;
  commentRevisions: CommentRevision[];
  studyReview: StudyReview;
  versionReview: VersionReviewDetail;
  tokens: TokenSummary[];
  token: TokenSummary;
  createdToken: CreatedToken;
  validationReport: ValidationReport;
  inbox: Inbox;
  unreadCount: UnreadCount;
  notificationPrefs: NotificationPrefs;
}

export type ResponseName = keyof ResponseContracts;

/** The schema of each answer: present in development builds and unit tests, absent in production. */
export type ResponseSchemas = { readonly [K in ResponseName]: z.ZodType<ResponseContracts[K]> };
