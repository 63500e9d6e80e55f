import { DestroyRef, Injectable, computed, inject, signal } from '@angular/core';
import type { Job, JobEvent } from '@laminote/contracts';
import { jobIsActive } from '@laminote/contracts/limits';
import { Subject, type Subscription, firstValueFrom } from 'rxjs';
import { byTime } from '../shared/format';
import { JobsApi } from '../shared/jobs-api';

/**
 * The jobs of the branch a notebook shows, followed while it is open: what runs, how far it is cell by
 * cell, and word of each output as it lands (the notebook then reads its draft again). Provided by the
 * notebook page.
 */
@Injectable()
export class BranchJobs {
  private readonly api = inject(JobsApi);
  private readonly jobsSignal = signal<ReadonlyMap<string, Job>>(new Map());
  private subscription: Subscription | null = null;
  private readonly landed = new Subject<{ jobId: string; cellId: string | null }>();

  /** An output landed (cellId), or a job finished (cellId null): the draft has news. */
  readonly outputs = this.landed.asObservable();
  /** Active jobs, oldest first. */
  readonly active = computed(() => [...this.jobsSignal().values()].filter((job) => jobIsActive(job.state)).sort((a, b) => byTime(a.createdAt, b.createdAt)));
  /** The last job that ended while the page looked on, or was ending when it opened. */
  readonly lastFinished = computed(() => [...this.jobsSignal().values()].filter((job) => !jobIsActive(job.state)).sort((a, b) => byTime(b.finishedAt ?? '', a.finishedAt ?? ''))[0] ?? null);
  /** Progress of each cell that an active job is computing, by cell id. */
  readonly cells = computed(() => {
    const out = new Map<string, { done: number; total: number; jobId: string }>();
    for (const job of this.active()) for (const cell of job.cells) if (cell.done < cell.total) out.set(cell.cellId, { done: cell.done, total: cell.total, jobId: job.jobId });
    return out;
  });

  /**
   * The cells each job has computed, by job id: their outputs are stored, though the rest of the job may
   * still be under way. Read from the jobs' own counts, so a page that connected after an output landed
   * (and so never heard of it) knows it from the first snapshot.
   */
  readonly computedCells = computed(() => {
    const out = new Map<string, ReadonlySet<string>>();
    for (const job of this.jobsSignal().values()) out.set(job.jobId, new Set(job.cells.filter((cell) => cell.done >= cell.total).map((cell) => cell.cellId)));
    return out;
  });

  constructor() {
    inject(DestroyRef).onDestroy(() => this.stop());
  }

  follow(branchId: string): void {
    this.stop();
    this.jobsSignal.set(new Map());
    this.subscription = this.api.events(branchId).subscribe((event) => this.take(event));
  }

  stop(): void {
    this.subscription?.unsubscribe();
    this.subscription = null;
  }

  /** A job this page queued itself, shown at once (the stream tells the rest). */
  add(job: Job): void {
    this.put(job);
  }

  async cancel(jobId: string): Promise<void> {
    this.put(await firstValueFrom(this.api.cancel(jobId)));
  }

  private take(event: JobEvent): void {
    if (event.type === 'snapshot') {
      const before = this.jobsSignal();
      this.jobsSignal.set(new Map(event.jobs.map((job) => [job.jobId, job])));
      // Jobs that ended while the connection was down: their outputs are in the draft now.
      if (event.jobs.some((job) => !jobIsActive(job.state) && before.get(job.jobId) && jobIsActive(before.get(job.jobId)!.state))) this.landed.next({ jobId: '', cellId: null });
    } else if (event.type === 'job') this.put(event.job);
    else this.landed.next({ jobId: event.jobId, cellId: event.cellId });
  }

  private put(job: Job): void {
    const before = this.jobsSignal().get(job.jobId);
    // Events may overtake one another; a job's count never goes back.
    if (before && jobIsActive(job.state) && job.done < before.done) return;
    this.jobsSignal.update((jobs) => new Map(jobs).set(job.jobId, job));
    if (before && jobIsActive(before.state) && !jobIsActive(job.state)) this.landed.next({ jobId: job.jobId, cellId: null });
  }
}
