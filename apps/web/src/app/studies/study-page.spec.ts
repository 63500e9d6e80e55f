import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { PROJECT_ID, STUDY_ID, me, problem, problemResponse, provideTestApp, signInAs, study } from '../../testing/test-app';

describe('StudyPage', () => {
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
    await signInAs(me());
  });

  afterEach(() => http.verify());

  async function open(answer: (request: ReturnType<HttpTestingController['expectOne']>) => void) {
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(`/studies/${STUDY_ID}`);
    await harness.fixture.whenStable();
    answer(http.expectOne(`/api/studies/${STUDY_ID}`));
    await navigation;
    await harness.fixture.whenStable();
    return harness.routeNativeElement as HTMLElement;
  }

  it('shows the study’s title and description over an empty notebook', async () => {
    const page = await open((request) => request.flush(study()));
    expect(page.querySelector('h1')?.textContent).toBe('Cruise upper surface, M 0.78');
    expect(page.textContent).toContain('Invented Cp distribution at cruise.');
    expect(page.textContent).toContain('no cells yet');
    const breadcrumb = page.querySelector('nav[aria-label="Breadcrumb"]');
    expect(breadcrumb?.querySelector(`a[href="/projects/${PROJECT_ID}"]`)?.textContent).toBe('Larkspur T-62 wing');
    expect(document.title).toBe('Cruise upper surface, M 0.78 · Laminote');
  });

  it('answers a study that is missing or not shared with the not-found page', async () => {
    const page = await open((request) => request.flush(problem(404, 'Not found'), problemResponse(404, 'Not Found')));
    expect(page.querySelector('h1')?.textContent).toBe('Study not found or not shared with you');
  });
});
