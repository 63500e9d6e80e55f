import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp, signInAs, me } from '../../testing/test-app';
import { InboxLink } from './inbox-link';

describe('InboxLink', () => {
  let http: HttpTestingController;
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(unreadCount: number) {
    await signInAs(me());
    const fixture = TestBed.createComponent(InboxLink);
    fixture.detectChanges();
    http.expectOne('/api/inbox/unread-count').flush({ unreadCount });
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  it('puts the unread count on the icon and says it in the link’s label', async () => {
    const host = await render(3);
    expect(host.querySelector('.count')?.textContent?.trim()).toBe('3');
    expect(host.querySelector('a')?.getAttribute('aria-label')).toBe('Inbox: 3 unread');
  });

  it('shows 99+ beyond 99', async () => {
    expect((await render(120)).querySelector('.count')?.textContent?.trim()).toBe('99+');
  });

  it('shows no count when nothing is unread', async () => {
    const host = await render(0);
    expect(host.querySelector('.count')).toBeNull();
    expect(host.querySelector('a')?.getAttribute('aria-label')).toBe('Inbox: nothing unread');
  });
});
