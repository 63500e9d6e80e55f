import { sql, type AnyColumn, type SQL } from 'drizzle-orm';
import type { VersionReview } from '@laminote/contracts';
import { reviewRequests, verdicts } from '../db/schema';

/**
 * The `review` field of a version in the history (libs/contracts versions.ts), as one SQL expression the
 * versions queries select: the state from the newest verdict of each reviewer (any "changes requested"
 * wins), else `requested` when someone was asked, with the time of the last request or verdict; null
 * when nobody was asked and nobody gave a verdict. Same rule as `reviewState` in ./verdicts.
 */
export function versionReviewColumn(versionId: AnyColumn): SQL<VersionReview | null> {
  return sql<VersionReview | null>`(
    select case
        when s.changes > 0 then json_build_object('state', 'changesRequested', 'updatedAt', s.at)
        when s.approvals > 0 then json_build_object('state', 'approved', 'updatedAt', s.at)
        when s.requests > 0 then json_build_object('state', 'requested', 'updatedAt', s.at)
      end
      from (
        select count(*) filter (where c.verdict = 'changes_requested') as changes,
               count(*) filter (where c.verdict = 'approved') as approvals,
               (select count(*) from ${reviewRequests} where ${reviewRequests.versionId} = ${versionId}) as requests,
               to_char(greatest(
                 (select max(${verdicts.createdAt}) from ${verdicts} where ${verdicts.versionId} = ${versionId}),
                 (select max(${reviewRequests.createdAt}) from ${reviewRequests} where ${reviewRequests.versionId} = ${versionId})
               ) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as at
          from (select distinct on (${verdicts.reviewerId}) ${verdicts.verdict} as verdict
                  from ${verdicts} where ${verdicts.versionId} = ${versionId}
                 order by ${verdicts.reviewerId}, ${verdicts.createdAt} desc, ${verdicts.id} desc) c
      ) s)`;
}
