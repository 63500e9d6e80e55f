import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Thread } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { STUDY_ID, provideTestApp } from '../../testing/test-app';
import { CommentThread } from './comment-thread';
import type { ReviewView } from './review-api';
import { ThreadStore } from './thread-store';
import { BRANCH_ID, ENGINEER_ID, MEMBERS, THREAD_ID, VERSION_ID, comment, thread } from './testing/review-fixtures';
import { CommentThreadHarness } from './testing/review-harnesses';

describe('CommentThread', () => {
  let http: HttpTestingController;
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(shown: Thread, options: { view?: ReviewView; canComment?: boolean } = {}) {
    const view = options.view ?? { versionId: VERSION_ID };
    // The store holds the page's threads; a thread answered by the server replaces its entry.
    const store = TestBed.inject(ThreadStore);
    store.view(STUDY_ID, view);
    http.expectOne((r) => r.url === `/api/studies/${STUDY_ID}/threads`).flush([shown]);
    const fixture = TestBed.createComponent(CommentThread);
    fixture.componentRef.setInput('thread', shown);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.componentRef.setInput('view', view);
    fixture.componentRef.setInput('members', MEMBERS);
    fixture.componentRef.setInput('canComment', options.canComment ?? true);
    fixture.detectChanges();
    const harness = await TestbedHarnessEnvironment.harnessForFixture(fixture, CommentThreadHarness);
    return { fixture, harness, store, view };
  }

  it('says which version it was started on, whether the cell changed since, and where on the plot it points', async () => {
    const { harness } = await render(thread({ onThisView: false, cellChanged: true, anchor: { surface: 'upper', x: 0.42 } }), { view: { branchId: BRANCH_ID } });
    expect(await harness.getOrigin()).toBe('On version 1 (main)');
    expect(await harness.saysCellChanged()).toBe(true);
    expect(await harness.getAnchor()).toBe('upper · x/c 0.420');
  });

  it('renders Markdown and drops anything that could run', async () => {
    const { harness } = await render(
      thread({ comments: [comment({ body: 'Trip at **5 %**?\n<img src=x onerror="alert(1)"><script>alert(2)</script><a href="javascript:alert(3)">see</a>' })] }),
    );
    const [first] = await harness.getComments();
    expect(first!.author).toBe('Lotte Brandvik');
    expect(first!.html).toContain('<strong>5 %</strong>');
    expect(first!.html).not.toMatch(/<script|onerror|<img|javascript:/);
    expect(first!.text).toContain('Trip at 5 %?');
  });

  it('marks mentions of members in the text, not inside code', async () => {
    const { harness } = await render(thread({ comments: [comment({ body: '@Dev Arjunan and @dev arjunan, see `@Dev Arjunan` and mail@Dev Arjunan' })] }));
    const [first] = await harness.getComments();
    expect(first!.html.match(/<span class="mention">@[^<]+<\/span>/g)).toEqual(['<span class="mention">@Dev Arjunan</span>', '<span class="mention">@dev arjunan</span>']);
    expect(first!.html).toContain('<code>@Dev Arjunan</code>');
  });

  it('lets only the author edit, and shows the earlier texts of an edited comment', async () => {
    const mine = comment({ id: 'b1c2d3e4-f5a6-4b7c-8d9e-0f1a2b3c4d5e', author: { id: ENGINEER_ID, name: 'Dev Arjunan' }, body: 'Trip stands for the bug-debris strip.', canEdit: true });
    const edited = comment({ editedAt: '2026-03-05T11:00:00.000Z', revisionCount: 2, body: 'Is N_crit 9 right for cruise at FL 370?' });
    const { harness } = await render(thread({ comments: [edited, mine] }));
    const [theirs, own] = await harness.getComments();
    expect(theirs).toMatchObject({ editable: false, edited: true });
    expect(own).toMatchObject({ editable: true, edited: false });

    await harness.toggleHistory(0);
    const revisions = http.expectOne(`/api/comments/${edited.id}/revisions`);
    revisions.flush([
      { revision: 1, body: 'Is N_crit 9 right for cruise?', createdAt: '2026-03-05T10:00:00.000Z' },
      { revision: 2, body: 'Is N_crit 9 right for cruise at FL 370?', createdAt: '2026-03-05T11:00:00.000Z' },
    ]);
    expect(await harness.getHistory(0)).toEqual(['Is N_crit 9 right for cruise?']);

    const box = await harness.edit(1);
    expect(await box.getText()).toBe('Trip stands for the bug-debris strip.');
    await box.type(' Checked against the invented tunnel run.');
    await box.send();
    const req = http.expectOne((r) => r.url === `/api/comments/${mine.id}` && r.method === 'PATCH');
    expect(req.request.params.get('versionId')).toBe(VERSION_ID);
    expect(req.request.body).toEqual({ body: 'Trip stands for the bug-debris strip. Checked against the invented tunnel run.' });
    req.flush(thread({ comments: [edited, { ...mine, body: req.request.body.body, revisionCount: 2, editedAt: '2026-03-05T12:00:00.000Z' }] }));
  });

  it('replies, and puts the server’s thread in the page’s store', async () => {
    const { harness, store, view } = await render(thread());
    const box = await harness.openReply();
    await box.type('M 0.68, @Lotte');
    await box.send();
    const req = http.expectOne((r) => r.url === `/api/threads/${THREAD_ID}/comments`);
    expect(req.request.body).toEqual({ body: 'M 0.68, @Lotte' });
    const answered = thread({ comments: [comment(), comment({ id: 'c2d3e4f5-a6b7-4c8d-9e0f-1a2b3c4d5e6f', body: 'M 0.68, @Lotte' })] });
    req.flush(answered);
    expect(store.view(STUDY_ID, view).threads()[0]!.comments).toHaveLength(2);
  });

  it('offers Resolve only where the server allows it, and Reopen on a resolved thread', async () => {
    const none = await render(thread({ canResolve: false }));
    expect(await none.harness.canResolve()).toBe(false);
    none.fixture.componentRef.setInput('thread', thread({ canResolve: true }));
    await none.harness.resolve();
    const req = http.expectOne(`/api/threads/${THREAD_ID}/resolve?versionId=${VERSION_ID}`);
    req.flush(thread({ canResolve: true, resolved: true, resolvedBy: { id: ENGINEER_ID, name: 'Dev Arjunan' } }));
    none.fixture.componentRef.setInput('thread', thread({ canResolve: true, resolved: true, resolvedBy: { id: ENGINEER_ID, name: 'Dev Arjunan' } }));
    expect(await none.harness.getResolvedNote()).toBe('Resolved by Dev Arjunan');
    expect(await none.harness.canReopen()).toBe(true);
  });

  it('folds a resolved thread to its first comment until opened, and offers no reply to a viewer', async () => {
    const { harness } = await render(thread({ resolved: true, comments: [comment(), comment({ id: 'd3e4f5a6-b7c8-4d9e-8f0a-1b2c3d4e5f6a', body: 'Done.' })] }), { canComment: false });
    expect(await harness.isCollapsed()).toBe(true);
    expect(await harness.getComments()).toHaveLength(1);
    await harness.expand();
    expect(await harness.getComments()).toHaveLength(2);
    expect(await harness.canReply()).toBe(false);
  });
});
