import { TestBed } from '@angular/core/testing';
import { HttpClient, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { studySchema } from '@laminote/contracts';
import { firstValueFrom } from 'rxjs';
import { describe, expect, it } from 'vitest';
import { checked, ContractDriftError } from './checked';

describe('checked responses', () => {
  function setUp() {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    return { http: TestBed.inject(HttpClient), server: TestBed.inject(HttpTestingController) };
  }
  const study = {
    id: '0f8fad5b-d9cb-469f-a165-70867728950e',
    projectId: '7c9e6679-7425-40de-944b-e07fc1f90ae7',
    title: 'Outboard section (invented)',
    description: '',
    archived: false,
    createdAt: '2026-03-03T10:00:00.000Z',
    updatedAt: '2026-03-03T10:00:00.000Z',
    createdBy: null,
  };

  it('passes a response that has its contract shape through unchanged', async () => {
    const { http, server } = setUp();
    const answer = firstValueFrom(http.get('/api/studies/x').pipe(checked('study', 'GET /api/studies/:id')));
    const body = { ...study, extra: 'kept' };
    server.expectOne('/api/studies/x').flush(body);
    const parsed = studySchema.safeParse(study);
    // The fixture itself must be a study, or this test proves nothing.
    expect(parsed.error?.issues ?? []).toEqual([]);
    expect(await answer).toEqual(body);
  });

  it('fails a response that drifted from its contract, naming the field, in tests and development builds', async () => {
    const { http, server } = setUp();
    const answer = firstValueFrom(http.get('/api/studies/x').pipe(checked('study', 'GET /api/studies/:id')));
    server.expectOne('/api/studies/x').flush({ ...study, title: 42 });
    const error = await answer.catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ContractDriftError);
    expect((error as Error).message).toMatch(/^GET \/api\/studies\/:id: the response does not match its contract \(title: /);
  });
});
