import { sql } from 'drizzle-orm';
import type { Tx } from '../db/client';

/**
 * The scheduled clean-up: outputs that no draft (cells or trash) and no version refers to, and that no
 * job under way will read, once older than `outputAgeDays`; the sweep cases and finished jobs of that
 * age; mail the outbox has sent, once older than `mailAgeDays`; and request budgets whose minute has
 * passed (rate_limits, kept an hour for the record). Each statement is one transaction,
 * so a clean-up cut short by a restart leaves everything consistent and the next one goes on.
 */
export interface RetentionPolicy {
  outputAgeDays: number;
  mailAgeDays: number;
}

export interface Pruned {
  outputs: number;
  sweepCases: number;
  jobs: number;
  mail: number;
  rateLimits: number;
}

export async function pruneRetained(tx: Tx, policy: RetentionPolicy): Promise<Pruned> {
  const outputAge = sql`make_interval(secs => ${policy.outputAgeDays * 86400})`;
  const mailAge = sql`make_interval(secs => ${policy.mailAgeDays * 86400})`;
  const active = sql`run_jobs.state in ('queued', 'running')`;
  const outputs = await tx.execute(sql`
    with drafted as (
      -- The output keys of the cells in a draft or in its trash (those of a cell in neither are left over).
      select k.value as keys from drafts, jsonb_each(drafts.output_keys) k
      where exists (select 1 from jsonb_array_elements(drafts.cells || drafts.trash) c where c ->> 'cellId' = k.key)
    ), referenced as (
      select keys ->> 'last' as key from drafted
      union select keys ->> 'good' from drafted
      union select output_key from version_cells
      union select w ->> 'key' from run_jobs, jsonb_array_elements(run_jobs.work) w where ${active}
    )
    delete from outputs o
    where o.computed_at < now() - ${outputAge}
      and not exists (select 1 from referenced r where r.key = o.key)`);
  const cases = await tx.execute(sql`
    delete from sweep_cases s
    where s.computed_at < now() - ${outputAge}
      and not exists (select 1 from run_jobs, jsonb_array_elements(run_jobs.work) w where ${active} and w ->> 'key' = s.sweep_key)`);
  const jobs = await tx.execute(sql`delete from run_jobs where finished_at < now() - ${outputAge} and not (${active})`);
  const mail = await tx.execute(sql`delete from mail_outbox where sent_at is not null and sent_at < now() - ${mailAge}`);
  const budgets = await tx.execute(sql`delete from rate_limits where expire < (extract(epoch from now()) * 1000)::bigint - 3600000`);
  return { outputs: outputs.rowCount ?? 0, sweepCases: cases.rowCount ?? 0, jobs: jobs.rowCount ?? 0, mail: mail.rowCount ?? 0, rateLimits: budgets.rowCount ?? 0 };
}
