import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { Router } from '@angular/router';
import type { Inbox, Notification } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { PROJECT_ID, STUDY_ID, me, provideTestApp, signInAs } from '../../testing/test-app';
import { InboxPage } from './inbox-page';
import { UnreadCount } from './unread-count';

function entry(overrides: Partial<Notification> = {}): Notification {
  return {
    id: '0f1e2d3c-4b5a-4968-8776-655443322110',
    kind: 'mention',
    actor: { id: '4c1f2e3d-5a6b-4c7d-8e9f-0a1b2c3d4e5f', name: 'Lotte Brandvik' },
    project: { id: PROJECT_ID, name: 'Larkspur T-62 wing' },
    study: { id: STUDY_ID, title: 'Outboard section, cruise' },
    title: 'Lotte Brandvik mentioned you on “Transition analysis”',
    excerpt: '@Dev Arjunan is the trip at 5 % intended?',
    link: `/studies/${STUDY_ID}?cell=3d4e5f60-7182-493a-abcd-ef0123456789&thread=4e5f6071-8293-4a4b-bcde-f01234567890`,
    createdAt: '2026-03-05T10:00:00.000Z',
    read: false,
    ...overrides,
  };
}

describe('InboxPage', () => {
  let http: HttpTestingController;
  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
    await signInAs(me());
  });
  afterEach(() => http.verify());

  async function render(inbox: Inbox) {
    const fixture = TestBed.createComponent(InboxPage);
    fixture.detectChanges();
    http.expectOne('/api/inbox').flush(inbox);
    http.expectOne('/api/me/notification-prefs').flush({ mention: true, reviewRequest: true, reply: false, verdict: true });
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    return { fixture, loader, root: fixture.nativeElement as HTMLElement };
  }

  it('lists entries newest first with their unread state, and opening one goes to the cell and marks it read', async () => {
    const second = entry({ id: '1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d', kind: 'reviewRequest', title: 'Mara Okonkwo asks you to review version 2 (main)', link: `/studies/${STUDY_ID}/versions/2c3d4e5f-6071-4829-9abc-def012345678`, read: true });
    const { root, fixture } = await render({ items: [entry(), second], unreadCount: 1 });
    expect(TestBed.inject(UnreadCount).value()).toBe(1);
    const items = Array.from(root.querySelectorAll<HTMLElement>('.entry'));
    expect(items.map((i) => i.classList.contains('unread'))).toEqual([true, false]);
    expect(items[0]!.querySelector('.title')!.textContent).toContain('mentioned you on “Transition analysis”');
    const router = TestBed.inject(Router);
    const link = items[0]!.querySelector<HTMLAnchorElement>('a.body')!;
    link.click();
    http.expectOne((r) => r.method === 'POST' && r.url === `/api/inbox/${entry().id}/read`).flush({ unreadCount: 0 });
    await fixture.whenStable();
    expect(router.url).toBe(entry().link);
    expect(TestBed.inject(UnreadCount).value()).toBe(0);
  });

  it('marks all read, filters to unread, and saves an e-mail preference', async () => {
    const { loader, root, fixture } = await render({ items: [entry()], unreadCount: 1 });
    await (await loader.getHarness(MatButtonHarness.with({ text: /Mark all read/ }))).click();
    http.expectOne('/api/inbox/read-all').flush({ unreadCount: 0 });
    fixture.detectChanges();
    expect(root.querySelector('.entry')!.classList.contains('unread')).toBe(false);

    await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Unread' }))).check();
    http.expectOne('/api/inbox?unread=true').flush({ items: [], unreadCount: 0 });
    fixture.detectChanges();
    expect(root.querySelector('.empty')!.textContent).toContain('Nothing unread.');

    const reply = await loader.getHarness(MatSlideToggleHarness.with({ label: /replies/ }));
    expect(await reply.isChecked()).toBe(false);
    await reply.check();
    const put = http.expectOne((r) => r.method === 'PUT' && r.url === '/api/me/notification-prefs');
    expect(put.request.body).toEqual({ reply: true });
    put.flush({ mention: true, reviewRequest: true, reply: true, verdict: true });
  });
});
