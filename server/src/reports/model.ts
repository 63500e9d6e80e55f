import { eq } from 'drizzle-orm';
import { ENGINE_CAUTION, ENGINE_VERSION, METHODS, type MethodEntry } from '@laminote/aero';
import { REVIEW_STATE_LABELS, VERDICT_LABELS, type VersionDetail, type VersionReviewDetail } from '@laminote/contracts';
import type { Tx } from '../db/client';
import { projects } from '../db/schema';
import { describeCell, type ReportCell } from './cell-sections';

/** Everything a version report shows, gathered once and drawn as HTML or PDF. */
export interface VersionReportModel {
  project: string;
  study: { id: string; title: string };
  version: { id: string; number: number; branchName: string; message: string; author: string; createdAt: string; isBaseline: boolean };
  review: {
    state: string;
    /** Verdicts on this version, the newest per reviewer first; older ones marked. */
    verdicts: { reviewer: string; verdict: string; summary: string; createdAt: string; current: boolean }[];
    pending: string[];
    /** When this version has no verdict of its own but an earlier one does. */
    earlier: string | null;
  };
  cells: ReportCell[];
  methods: MethodEntry[];
  caution: string;
  engineVersion: string;
  generatedAt: string;
  generatedBy: string;
}

export async function buildVersionReport(
  tx: Tx,
  input: { projectId: string; study: { id: string; title: string }; version: VersionDetail; review: VersionReviewDetail; generatedBy: string },
): Promise<VersionReportModel> {
  const [project] = await tx.select({ name: projects.name }).from(projects).where(eq(projects.id, input.projectId));
  const { version, review } = input;
  const titles = new Map(version.cells.map((c) => [c.cellId, c.title]));
  const cells = [...version.cells].sort((a, b) => a.position - b.position).map((c) => describeCell(c, titles));
  const used = new Set(cells.flatMap((c) => c.methods));
  const earlier = review.summary.earlierVerdict;
  return {
    project: project?.name ?? '',
    study: input.study,
    version: {
      id: version.id,
      number: version.number,
      branchName: version.branchName,
      message: version.message,
      author: version.author?.name ?? 'unknown',
      createdAt: version.createdAt,
      isBaseline: version.isBaseline,
    },
    review: {
      state: REVIEW_STATE_LABELS[review.summary.state],
      verdicts: [...review.verdicts]
        .sort((a, b) => Number(b.current) - Number(a.current) || b.createdAt.localeCompare(a.createdAt))
        .map((v) => ({ reviewer: v.reviewer?.name ?? 'former member', verdict: VERDICT_LABELS[v.verdict], summary: v.summary, createdAt: v.createdAt, current: v.current })),
      pending: review.summary.pendingReviewers.map((p) => p?.name ?? 'former member'),
      earlier: earlier ? `${REVIEW_STATE_LABELS[earlier.state]} on v${earlier.versionNumber} (${earlier.branchName}), an earlier version` : null,
    },
    cells,
    methods: METHODS.filter((m) => used.has(m.id)),
    caution: ENGINE_CAUTION,
    engineVersion: ENGINE_VERSION,
    generatedAt: new Date().toISOString(),
    generatedBy: input.generatedBy,
  };
}

/** A file name from words: ASCII letters, digits and hyphens, at most 80 characters. */
export function fileSlug(words: string): string {
  return words
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/\s+/g, '-')
    .slice(0, 80);
}

export function reportFileName(model: VersionReportModel, extension: 'html' | 'pdf'): string {
  const slug = fileSlug(`${model.study.title} v${model.version.number} ${model.version.branchName}`);
  return `${slug || 'laminote-report'}.${extension}`;
}

export { when } from './format';
