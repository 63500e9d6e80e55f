import { HttpClient, HttpErrorResponse, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { afterEach, describe, expect, it } from 'vitest';
import { EARLY_READ_FRESH_MS, type EarlyAnswer, earlyReadsInterceptor } from './early-reads';

describe('the app’s first reads, answered from early-reads.js', () => {
  function setUp(reads: Record<string, Promise<EarlyAnswer>>, startedAt = Date.now()) {
    window.laminoteEarlyReads = { startedAt, reads: new Map(Object.entries(reads)) };
    TestBed.configureTestingModule({ providers: [provideHttpClient(withInterceptors([earlyReadsInterceptor])), provideHttpClientTesting()] });
    return { http: TestBed.inject(HttpClient), server: TestBed.inject(HttpTestingController) };
  }
  const json = (status: number, body: unknown): Promise<EarlyAnswer> =>
    Promise.resolve({ status, statusText: status === 200 ? 'OK' : 'Not Found', contentType: 'application/json', body: JSON.stringify(body) });

  afterEach(() => {
    TestBed.inject(HttpTestingController).verify();
    delete window.laminoteEarlyReads;
  });

  it('answers the first GET of an address it read, without asking the server, and only that one', async () => {
    const { http, server } = setUp({ '/api/studies/s1': json(200, { id: 's1', title: 'Outboard section (invented)' }) });
    await expect(firstValueFrom(http.get('/api/studies/s1'))).resolves.toEqual({ id: 's1', title: 'Outboard section (invented)' });
    // The second read of the same address is the server's: an early answer serves once.
    const again = firstValueFrom(http.get('/api/studies/s1'));
    server.expectOne('/api/studies/s1').flush({ id: 's1', title: 'Renamed' });
    await expect(again).resolves.toEqual({ id: 's1', title: 'Renamed' });
  });

  it('passes a refusal on as the server’s error response, with its problem body', async () => {
    const problem = { type: 'about:blank', title: 'Not found', status: 404 };
    const { http } = setUp({ '/api/studies/s2': json(404, problem) });
    const error = await firstValueFrom(http.get('/api/studies/s2')).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HttpErrorResponse);
    expect((error as HttpErrorResponse).status).toBe(404);
    expect((error as HttpErrorResponse).error).toEqual(problem);
  });

  it('asks the server when the early read failed on the way, was for another address, or is stale', async () => {
    const failed = Promise.reject(new TypeError('Failed to fetch'));
    failed.catch(() => undefined);
    const { http, server } = setUp({ '/api/me': failed, '/api/studies/s3/branches': json(200, []) });
    const me = firstValueFrom(http.get('/api/me'));
    await Promise.resolve();
    await new Promise((r) => setTimeout(r));
    server.expectOne('/api/me').flush({ user: { name: 'Dev' } });
    await expect(me).resolves.toEqual({ user: { name: 'Dev' } });

    const other = firstValueFrom(http.get('/api/studies/s4/branches'));
    server.expectOne('/api/studies/s4/branches').flush([{ id: 'b' }]);
    await expect(other).resolves.toEqual([{ id: 'b' }]);
  });

  it('leaves a stale early read alone', async () => {
    const { http, server } = setUp({ '/api/studies/s5': json(200, { title: 'old' }) }, Date.now() - EARLY_READ_FRESH_MS - 1);
    const answer = firstValueFrom(http.get('/api/studies/s5'));
    server.expectOne('/api/studies/s5').flush({ title: 'new' });
    await expect(answer).resolves.toEqual({ title: 'new' });
  });

  it('never answers a change: a PUT to an address it read goes to the server', async () => {
    const { http, server } = setUp({ '/api/branches/b1/draft': json(200, { revision: 1 }) });
    const put = firstValueFrom(http.put('/api/branches/b1/draft', { baseRevision: 1, cells: [] }));
    server.expectOne({ method: 'PUT', url: '/api/branches/b1/draft' }).flush({ revision: 2 });
    await expect(put).resolves.toEqual({ revision: 2 });
  });
});
