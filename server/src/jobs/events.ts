import { EventEmitter } from 'node:events';
import { setTimeout as sleep } from 'node:timers/promises';
import pg from 'pg';
import type { Logger } from '../logger';
import { JOB_CHANNEL, type JobNotice } from './store';

/**
 * An ear on the job channel: one connection that LISTENs for what workers and app servers notify. An
 * app server hands each notice to the pages following that branch; a job worker wakes to it. When the connection is lost (the database
 * restarted) it connects again, and then asks every follower to resend the true state, since notices
 * sent meanwhile are gone.
 */
export class JobEvents {
  private readonly emitter = new EventEmitter().setMaxListeners(0);
  private client: pg.Client | null = null;
  private closed = false;
  private connectedOnce = false;

  constructor(
    private readonly databaseUrl: string,
    private readonly logger: Logger,
  ) {}

  start(): void {
    void this.connect();
  }

  private async connect(): Promise<void> {
    for (let attempt = 0; !this.closed; attempt++) {
      const client = new pg.Client({ connectionString: this.databaseUrl, keepAlive: true });
      client.on('error', (err) => this.logger.warn({ err: err.message }, 'the job events connection failed'));
      client.on('notification', (msg) => {
        try {
          const notice = JSON.parse(msg.payload ?? '') as JobNotice;
          this.emitter.emit(`branch:${notice.branchId}`, notice);
          this.emitter.emit('notice', notice);
        } catch {
          // Not ours.
        }
      });
      try {
        await client.connect();
        await client.query(`listen ${JOB_CHANNEL}`);
      } catch {
        await client.end().catch(() => undefined);
        await sleep(Math.min(500 * 2 ** attempt, 5000));
        continue;
      }
      if (this.closed) {
        await client.end().catch(() => undefined);
        return;
      }
      this.client = client;
      client.once('end', () => {
        this.client = null;
        if (!this.closed) void this.connect();
      });
      if (this.connectedOnce) this.emitter.emit('resync');
      this.connectedOnce = true;
      return;
    }
  }

  /** Follows a branch: `onNotice` for each notice, `onResync` after the connection came back. */
  subscribe(branchId: string, onNotice: (notice: JobNotice) => void, onResync: () => void): () => void {
    this.emitter.on(`branch:${branchId}`, onNotice);
    this.emitter.on('resync', onResync);
    return () => {
      this.emitter.off(`branch:${branchId}`, onNotice);
      this.emitter.off('resync', onResync);
    };
  }

  /** Hears every notice, of every branch (a job worker wakes to it when work may have been queued). */
  onNotice(listener: (notice: JobNotice) => void): void {
    this.emitter.on('notice', listener);
  }

  async close(): Promise<void> {
    this.closed = true;
    await this.client?.end().catch(() => undefined);
  }
}
