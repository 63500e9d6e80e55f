import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { me, provideTestApp, signInAs } from '../../testing/test-app';
import { FLOW_ID, NOTE_ID, cell, draft } from '../../testing/notebook-fixtures';
import { DraftSession } from '../shared/draft-session';
import { MAIN_ID, STUDY_ID, history } from '../versions/testing/version-fixtures';
import { snapshotOf, writeSnapshot } from './last-look';
import { SinceLastLook } from './since-last-look';

describe('SinceLastLook', () => {
  let http: HttpTestingController;
  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ providers: [...provideTestApp(), DraftSession] });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function open(seen: ReturnType<typeof snapshotOf> | null) {
    const person = me();
    await signInAs(person);
    if (seen) writeSnapshot(person.user.id, MAIN_ID, seen);
    const session = TestBed.inject(DraftSession);
    // The draft as it is now: the flow's Reynolds number changed by someone else, a note added.
    session.open(
      MAIN_ID,
      draft([cell('flow', FLOW_ID, { title: 'Cruise', inputs: { mode: 'reynolds', reynolds: 8e6, mach: 0, turbulenceMode: 'nCrit', nCrit: 9 } }), cell('note', NOTE_ID, { title: 'Why Re 8 million' })], {
        branchId: MAIN_ID,
        revision: 7,
      }),
    );
    const fixture = TestBed.createComponent(SinceLastLook);
    fixture.componentRef.setInput('studyId', STUDY_ID);
    fixture.componentRef.setInput('branchId', MAIN_ID);
    fixture.detectChanges();
    return fixture;
  }

  it('says what changed on the branch since the person last had the study open', async () => {
    // What they saw on 5 March at 08:00: the flow at Re 4 million, and a cell since removed.
    const before = snapshotOf(
      [
        cell('flow', FLOW_ID, { title: 'Cruise', inputs: { mode: 'reynolds', reynolds: 4e6, mach: 0, turbulenceMode: 'nCrit', nCrit: 9 } }),
        cell('analysis', '11111111-2222-4333-8444-555555555503', { title: 'Old trip study' }),
      ],
      3,
      new Date('2026-03-05T08:00:00.000Z'),
    );
    const fixture = await open(before);
    // The comparison waits for the browser's first idle moment after the first drawing.
    expect(localStorage.getItem(`laminote.lastLook.${me().user.id}.${MAIN_ID}`)).toContain('"revision":3');
    const request = await vi.waitFor(() => http.expectOne(`/api/studies/${STUDY_ID}/versions`));
    request.flush(history());
    await fixture.whenStable();
    const text = (fixture.nativeElement as HTMLElement).textContent!.replace(/\s+/g, ' ');
    expect(text).toContain('Since you last looked');
    // Both versions are Oskar Lind's and newer than 08:00 on 5 March (fixtures: 09:00 on 5 and 6 March).
    expect(text).toContain('Oskar Lind saved version 1 (“Cruise baseline”)');
    expect(text).toContain('Oskar Lind saved version 2 (“Re 8 million”)');
    expect(text).toContain('changed: Cruise');
    expect(text).toContain('added: Why Re 8 million');
    expect(text).toContain('removed: Old trip study');
  });

  it('says nothing on a first visit, and remembers it for the next', async () => {
    const fixture = await open(null);
    await vi.waitFor(() => expect(localStorage.getItem(`laminote.lastLook.${me().user.id}.${MAIN_ID}`)).toContain('"revision":7'));
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent!.trim()).toBe('');
  });

  it('compares with what was seen before even when an edit comes before the browser is idle, and remembers the edit after', async () => {
    const idle: (() => void)[] = [];
    vi.useFakeTimers();
    vi.stubGlobal('requestIdleCallback', (run: () => void) => idle.push(run));
    try {
      const key = `laminote.lastLook.${me().user.id}.${MAIN_ID}`;
      const before = snapshotOf([cell('flow', FLOW_ID, { title: 'Cruise', inputs: { mode: 'reynolds', reynolds: 4e6, mach: 0, turbulenceMode: 'nCrit', nCrit: 9 } })], 3, new Date('2026-03-05T08:00:00.000Z'));
      const fixture = await open(before);
      TestBed.inject(DraftSession).setTitle(NOTE_ID, 'Why Re 8 million, edited');
      fixture.detectChanges();
      // The edit's snapshot is due after 500 ms, but the browser has not been idle yet: what was seen stays.
      await vi.advanceTimersByTimeAsync(600);
      expect(JSON.parse(localStorage.getItem(key)!)).toMatchObject({ revision: 3 });
      for (const run of idle.splice(0)) run();
      await vi.advanceTimersByTimeAsync(0);
      http.expectOne(`/api/studies/${STUDY_ID}/versions`).flush(history());
      fixture.detectChanges();
      const text = (fixture.nativeElement as HTMLElement).textContent!.replace(/\s+/g, ' ');
      // Compared with the draft as opened (the note's first title), then the edit remembered.
      expect(text).toContain('changed: Cruise');
      expect(text).toContain('added: Why Re 8 million');
      expect(text).not.toContain('edited');
      const kept = JSON.parse(localStorage.getItem(key)!) as ReturnType<typeof snapshotOf>;
      expect(kept.cells[NOTE_ID]!.title).toBe('Why Re 8 million, edited');
    } finally {
      vi.useRealTimers();
      vi.unstubAllGlobals();
    }
  });
});
