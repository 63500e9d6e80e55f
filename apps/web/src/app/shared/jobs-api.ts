import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, NgZone, inject } from '@angular/core';
import type { Job, JobEvent } from '@laminote/contracts';
import { jobIsActive } from '@laminote/contracts/limits';
import { Observable, firstValueFrom } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';
import { RUNTIME_CHECKS, type RuntimeChecks } from './runtime-checks';

/** Runs as jobs: how far one is, cancelling it, and a branch's jobs as they move (server-sent events). */
@Injectable({ providedIn: 'root' })
export class JobsApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);
  private readonly zone = inject(NgZone);
  private readonly checks = inject(RUNTIME_CHECKS);

  job(jobId: string): Observable<Job> {
    return this.http.get(`${this.base}/jobs/${encodeURIComponent(jobId)}`).pipe(checked('job', 'GET /jobs/:jobId'));
  }

  cancel(jobId: string): Observable<Job> {
    return this.http.delete(`${this.base}/jobs/${encodeURIComponent(jobId)}`).pipe(checked('job', 'DELETE /jobs/:jobId'));
  }

  /**
   * The job once it has finished (completed, failed or cancelled), asked for every `everyMs`. A moment
   * without an answer (the server restarting, the database away) is waited out, not an error.
   */
  async finished(jobId: string, everyMs = 700): Promise<Job> {
    for (let misses = 0; ; ) {
      try {
        const job = await firstValueFrom(this.job(jobId));
        misses = 0;
        if (!jobIsActive(job.state)) return job;
      } catch (error) {
        const status = error instanceof HttpErrorResponse ? error.status : -1;
        if (!(status === 0 || status === 502 || status === 503 || status === 504) || ++misses > 120) throw error;
      }
      await new Promise((resolve) => setTimeout(resolve, everyMs));
    }
  }

  /**
   * The branch's jobs as they move, for as long as it is subscribed. The browser reconnects by itself
   * after a lost connection (a server restart); the server then starts again with the true state.
   */
  events(branchId: string): Observable<JobEvent> {
    return new Observable<JobEvent>((subscriber) => {
      // No EventSource (server-side rendering, a unit test's document): nothing to follow.
      if (typeof EventSource === 'undefined') return undefined;
      const source = new EventSource(`${this.base}/branches/${encodeURIComponent(branchId)}/events`, { withCredentials: true });
      const deliver = (checks: RuntimeChecks, data: unknown) => {
        const parsed = checks.jobEventSchema.safeParse(data);
        if (parsed.success) this.zone.run(() => subscriber.next(parsed.data));
      };
      // Each event is checked with its schema, loaded apart from the first screen once the browser is
      // next idle (a study's page follows its jobs from the start, and running zod's 470 kB inside the
      // first drawing held that drawing up by about 50 ms): the few events that come before it has
      // loaded wait for it, in order.
      let ready: Promise<unknown> = this.checks.loadWhenIdle().catch((error: unknown) => subscriber.error(error));
      source.onmessage = (message: MessageEvent<string>) => {
        const data: unknown = JSON.parse(message.data);
        const checks = this.checks.module();
        if (checks) deliver(checks, data);
        else
          ready = ready.then(() => {
            const loaded = this.checks.module();
            if (loaded) deliver(loaded, data);
          });
      };
      return () => source.close();
    });
  }
}
