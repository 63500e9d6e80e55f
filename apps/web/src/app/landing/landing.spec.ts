import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { pageNavigation, problem, problemResponse, provideTestApp, signedOut } from '../../testing/test-app';
import { Auth } from '../core/auth';
import { Landing } from './landing';

describe('Landing', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
  });

  afterEach(() => TestBed.inject(HttpTestingController).verify());

  async function render(inputs: { returnTo?: string; reason?: string } = {}) {
    const fixture = TestBed.createComponent(Landing);
    for (const [name, value] of Object.entries(inputs)) fixture.componentRef.setInput(name, value);
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture) };
  }

  it('says what Laminote is for, shows the engineering caution and offers to sign in', async () => {
    await signedOut();
    const { fixture, loader } = await render();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('natural-laminar-flow');
    expect(text).toContain('engineering estimates from integral methods and empirical criteria');
    expect(text).toContain('validated tools, test data and governing design and certification practice decide');

    const signIn = await loader.getHarness(MatButtonHarness.with({ text: /Sign in/ }));
    await signIn.click();
    expect(pageNavigation().visited).toEqual(['/auth/login?returnTo=%2Fprojects']);
  });

  it('brings the person back to the page they were sent away from', async () => {
    await signedOut();
    const { loader } = await render({ returnTo: '/projects/abc?tab=members' });
    await (await loader.getHarness(MatButtonHarness.with({ text: /Sign in/ }))).click();
    expect(pageNavigation().visited).toEqual(['/auth/login?returnTo=%2Fprojects%2Fabc%3Ftab%3Dmembers']);
  });

  it('never sends the browser to another site after sign-in', async () => {
    await signedOut();
    const { loader } = await render({ returnTo: '//evil.example/phish' });
    await (await loader.getHarness(MatButtonHarness.with({ text: /Sign in/ }))).click();
    expect(pageNavigation().visited).toEqual(['/auth/login?returnTo=%2Fprojects']);
  });

  it('says so when the session has ended', async () => {
    await signedOut();
    const { fixture } = await render({ reason: 'session-ended' });
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Your session has ended');
  });

  it('says so when the server cannot tell who is signed in', async () => {
    const loading = TestBed.inject(Auth).load();
    TestBed.inject(HttpTestingController)
      .expectOne('/api/me')
      .flush(problem(503, 'Database unavailable', { detail: 'Try again in a minute.' }), problemResponse(503, 'Service Unavailable'));
    await loading;
    const { fixture } = await render();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('Database unavailable: Try again in a minute.');
  });
});
