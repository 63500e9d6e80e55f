import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { JobEvent } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { JobsApi } from './jobs-api';
import { type LazyModule, lazyModule } from './lazy-module';
import { RUNTIME_CHECKS, type RuntimeChecks } from './runtime-checks';

/** A stand-in for the browser's EventSource: the test sends the server's messages itself. */
class FakeEventSource {
  static opened: FakeEventSource[] = [];
  onmessage: ((message: MessageEvent<string>) => void) | null = null;
  closed = false;
  constructor(
    readonly url: string,
    readonly init?: EventSourceInit,
  ) {
    FakeEventSource.opened.push(this);
  }
  send(data: unknown): void {
    this.onmessage?.({ data: JSON.stringify(data) } as MessageEvent<string>);
  }
  close(): void {
    this.closed = true;
  }
}

const BRANCH = '11111111-2222-4333-8444-555555555501';
const JOB = '11111111-2222-4333-8444-5555555555aa';
const CELL = '11111111-2222-4333-8444-555555555505';

describe('JobsApi.events', () => {
  let idle: (() => void)[];
  /** This spec's own copy of the schemas' loader: the module shared by the suite may be loaded already. */
  let checks: LazyModule<RuntimeChecks>;

  beforeEach(() => {
    FakeEventSource.opened = [];
    idle = [];
    vi.stubGlobal('EventSource', FakeEventSource);
    vi.stubGlobal('requestIdleCallback', (run: () => void) => idle.push(run));
    checks = lazyModule(() => import('./runtime-schemas'));
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), { provide: RUNTIME_CHECKS, useValue: checks }] });
  });

  afterEach(() => vi.unstubAllGlobals());

  it('delivers the events checked and in order, holding those that come before its schemas have loaded', async () => {
    const seen: JobEvent[] = [];
    const subscription = TestBed.inject(JobsApi)
      .events(BRANCH)
      .subscribe((event) => seen.push(event));
    const [source] = FakeEventSource.opened;
    expect(source!.url).toBe(`/api/branches/${BRANCH}/events`);
    expect(source!.init).toEqual({ withCredentials: true });

    // The schemas load at the browser's first idle moment: until then the events are held back.
    source!.send({ type: 'snapshot', jobs: [] });
    source!.send({ type: 'output', jobId: 'not a uuid', cellId: CELL });
    source!.send({ type: 'output', jobId: JOB, cellId: CELL });
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(checks.module()).toBeNull();
    expect(seen).toEqual([]);
    expect(idle).toHaveLength(1);

    // Idle: the two well-formed events arrive in the order sent, the malformed one not at all.
    for (const run of idle.splice(0)) run();
    await vi.waitFor(() => expect(seen).toHaveLength(2));
    expect(seen).toEqual([
      { type: 'snapshot', jobs: [] },
      { type: 'output', jobId: JOB, cellId: CELL },
    ]);

    // Once loaded, an event is checked and delivered as it comes.
    source!.send({ type: 'output', jobId: JOB, cellId: CELL });
    expect(seen).toHaveLength(3);

    subscription.unsubscribe();
    expect(source!.closed).toBe(true);
  });
});
