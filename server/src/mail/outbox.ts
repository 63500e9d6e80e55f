import { eq, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client';
import { mailOutbox } from '../db/schema';
import type { Logger } from '../logger';
import type { MailMessage, Mailer } from './mailer';

/**
 * The mail outbox. A change that causes mail (a mention, a review request) enqueues it in the same
 * transaction, so mail is sent exactly when the change lands. A sender loop in every server process
 * takes due rows and sends them; a mail server that is down only delays mail: the row stays and is
 * retried with exponential back-off until it is accepted.
 */
export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string | null;
}

export async function enqueueMail(tx: Tx, mail: OutgoingMail): Promise<void> {
  await tx.insert(mailOutbox).values({ toEmail: mail.to, subject: mail.subject, text: mail.text, html: mail.html ?? null });
}

export interface OutboxSenderOptions {
  /** How often to look for due mail. */
  pollMs?: number;
  /** Rows taken per round. */
  batchSize?: number;
  /**
   * A taken row is not due again for this long, so another process does not send it while this one
   * is sending; should this process die mid-send, the row is retried after the lease.
   */
  leaseMs?: number;
  /** Back-off after the n-th failed attempt: base · 2^(n−1), capped, with ±20 % jitter. */
  baseDelayMs?: number;
  maxDelayMs?: number;
  /** Domain for Message-IDs (so a retried message keeps its id). */
  messageIdDomain?: string;
}

export function retryDelayMs(attempts: number, baseDelayMs: number, maxDelayMs: number, random = Math.random): number {
  const exponential = Math.min(maxDelayMs, baseDelayMs * 2 ** Math.max(0, attempts - 1));
  return Math.round(exponential * (0.8 + 0.4 * random()));
}

interface ClaimedRow {
  id: number;
  to_email: string;
  subject: string;
  text: string;
  html: string | null;
  attempts: number;
  created_at: Date;
}

export class OutboxSender {
  private readonly pollMs: number;
  private readonly batchSize: number;
  private readonly leaseMs: number;
  private readonly baseDelayMs: number;
  private readonly maxDelayMs: number;
  private readonly messageIdDomain: string;
  private timer: NodeJS.Timeout | null = null;
  private running: Promise<unknown> | null = null;
  private stopped = true;

  constructor(
    private readonly db: Db,
    private readonly mailer: Mailer,
    private readonly logger: Logger,
    options: OutboxSenderOptions = {},
  ) {
    this.pollMs = options.pollMs ?? 1000;
    this.batchSize = options.batchSize ?? 20;
    this.leaseMs = options.leaseMs ?? 120_000;
    this.baseDelayMs = options.baseDelayMs ?? 5_000;
    this.maxDelayMs = options.maxDelayMs ?? 3_600_000;
    this.messageIdDomain = options.messageIdDomain ?? 'laminote.invalid';
  }

  /** Takes due rows (skipping rows another process holds) and leases them to this process. */
  private async claim(): Promise<ClaimedRow[]> {
    const lease = `${this.leaseMs} milliseconds`;
    const result = await this.db.execute<ClaimedRow & Record<string, unknown>>(sql`
      update ${mailOutbox}
         set attempts = attempts + 1, next_attempt_at = now() + ${lease}::interval
       where id in (
         select id from ${mailOutbox}
          where sent_at is null and next_attempt_at <= now()
          order by next_attempt_at, id
          limit ${this.batchSize}
          for update skip locked)
      returning id, to_email, subject, text, html, attempts, created_at`);
    return result.rows;
  }

  /** One round: send what is due. Answers how many were sent and how many failed (to be retried). */
  async runOnce(): Promise<{ sent: number; failed: number }> {
    const rows = await this.claim();
    let sent = 0;
    let failed = 0;
    for (const row of rows) {
      const message: MailMessage = {
        to: row.to_email,
        subject: row.subject,
        text: row.text,
        html: row.html,
        messageId: `<outbox-${row.id}.${new Date(row.created_at).getTime()}@${this.messageIdDomain}>`,
      };
      try {
        await this.mailer.send(message);
        await this.db.update(mailOutbox).set({ sentAt: sql`now()`, lastError: null }).where(eq(mailOutbox.id, row.id));
        sent++;
      } catch (err) {
        failed++;
        const delay = retryDelayMs(row.attempts, this.baseDelayMs, this.maxDelayMs);
        const reason = err instanceof Error ? err.message : String(err);
        await this.db
          .update(mailOutbox)
          .set({ nextAttemptAt: sql`now() + ${`${delay} milliseconds`}::interval`, lastError: reason.slice(0, 1000) })
          .where(eq(mailOutbox.id, row.id));
        this.logger.warn({ outboxId: row.id, attempts: row.attempts, retryInMs: delay, err: reason }, 'mail not sent; will retry');
      }
    }
    if (sent > 0) this.logger.info({ sent }, 'mail sent');
    return { sent, failed };
  }

  /** Starts the loop. Errors (the database away for a moment) are logged and the loop goes on. */
  start(): void {
    if (!this.stopped) return;
    this.stopped = false;
    const tick = async () => {
      if (this.stopped) return;
      this.running = this.runOnce().catch((err: unknown) => this.logger.error({ err }, 'mail outbox round failed'));
      await this.running;
      this.running = null;
      if (!this.stopped) this.timer = setTimeout(() => void tick(), this.pollMs);
    };
    this.timer = setTimeout(() => void tick(), 0);
  }

  /** Stops the loop and waits for a round in progress to finish. */
  async stop(): Promise<void> {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    await this.running;
  }
}
