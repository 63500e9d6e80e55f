import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { Router } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { me, pageNavigation, problem, problemResponse, project, provideTestApp, signInAs, signedOut } from '../testing/test-app';
import { App } from './app';

describe('App shell', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // While someone is signed in, the top bar asks how many inbox entries are unread.
    for (const request of http.match('/api/inbox/unread-count')) request.flush({ unreadCount: 0 });
    http.verify();
    document.cookie = 'XSRF-TOKEN=; expires=Thu, 01 Jan 1970 00:00:00 GMT; path=/';
  });

  async function render(url: string) {
    const fixture = TestBed.createComponent(App);
    await TestBed.inject(Router).navigateByUrl(url);
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture), element: fixture.nativeElement as HTMLElement };
  }

  it('names the product and the signed-in person, and signs out with the anti-forgery token', async () => {
    document.cookie = 'XSRF-TOKEN=token-from-server; path=/';
    await signInAs(me());
    const { fixture, loader, element } = await render('/projects');
    http.expectOne('/api/projects').flush([project()]);
    http.expectOne('/api/inbox/unread-count').flush({ unreadCount: 3 });
    await fixture.whenStable();

    expect(element.querySelector('[role="banner"]')?.textContent).toContain('Laminote');
    expect(element.querySelector('[role="banner"] a[href="/inbox"]')?.getAttribute('aria-label')).toBe('Inbox: 3 unread');
    const menu = await loader.getHarness(MatMenuHarness.with({ selector: '[aria-label="Account: Ines Varga"]' }));
    await menu.open();
    const items = await menu.getItems();
    const texts = await Promise.all(items.map((item) => item.getText()));
    expect(texts).toEqual([expect.stringContaining('API tokens'), expect.stringContaining('Sign out')]);
    await items[1].click();

    const logout = http.expectOne({ method: 'POST', url: '/auth/logout' });
    expect(logout.request.headers.get('X-XSRF-TOKEN')).toBe('token-from-server');
    logout.flush({ redirectTo: 'http://127.0.0.1:4400/session/end?post_logout_redirect_uri=x' });
    await fixture.whenStable();
    expect(pageNavigation().visited).toEqual(['http://127.0.0.1:4400/session/end?post_logout_redirect_uri=x']);
  });

  it('shows no account menu to a signed-out visitor', async () => {
    await signedOut();
    const { loader } = await render('/');
    expect(await loader.getAllHarnesses(MatMenuHarness)).toHaveLength(0);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Sign in/ }))).toHaveLength(1);
  });

  it('sends a signed-out visitor of a project to the landing page, remembering where they were going', async () => {
    await signedOut();
    const { element } = await render('/projects/abc');
    expect(TestBed.inject(Router).url).toBe('/?returnTo=%2Fprojects%2Fabc');
    expect(element.textContent).toContain('Sign in');
  });

  it('takes a signed-in person from the landing page to their projects', async () => {
    await signInAs(me());
    const { fixture } = await render('/');
    expect(TestBed.inject(Router).url).toBe('/projects');
    http.expectOne('/api/projects').flush([]);
    await fixture.whenStable();
  });

  it('goes to the landing page when the session ends mid-way', async () => {
    await signInAs(me());
    const { fixture, loader, element } = await render('/projects');
    http.expectOne('/api/projects').flush(problem(401, 'Sign in first'), problemResponse(401, 'Unauthorized'));
    await fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/?returnTo=%2Fprojects&reason=session-ended');
    expect(element.textContent).toContain('Your session has ended');
    expect(await loader.getAllHarnesses(MatMenuHarness)).toHaveLength(0);
  });

  it('answers an unknown address with a not-found page', async () => {
    await signInAs(me());
    const { element } = await render('/no/such/page');
    expect(element.querySelector('h1')?.textContent).toBe('Page not found');
  });
});
