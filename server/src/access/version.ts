import { eq } from 'drizzle-orm';
import { isUuid } from '@laminote/contracts';
import type { SessionUser } from '../auth/types';
import type { Tx } from '../db/client';
import { versions } from '../db/schema';
import { notFound } from '../http/problem';
import { studyAccess } from './access';

/** The caller's access to a saved version, through its study: 404 for one they cannot see, as for one that does not exist. */
export async function versionAccess(tx: Tx, user: SessionUser, versionId: string) {
  if (!isUuid(versionId)) throw notFound('version');
  const [version] = await tx.select({ id: versions.id, studyId: versions.studyId }).from(versions).where(eq(versions.id, versionId));
  if (!version) throw notFound('version');
  const context = await studyAccess(tx, user, version.studyId).catch(() => {
    throw notFound('version');
  });
  return { version, ...context, place: { studyId: context.study.id, projectId: context.projectId } };
}
