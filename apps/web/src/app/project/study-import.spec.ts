import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { Router } from '@angular/router';
import { STUDY_DOCUMENT_FORMAT } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PROJECT_ID, STUDY_ID, problem, problemResponse, provideTestApp } from '../../testing/test-app';
import { readStudyFile } from './study-import';
import { StudyList } from './study-list';

const BRANCH_ID = '5e6f7a8b-9c0d-4e1f-a2b3-c4d5e6f7a8b9';

/** A study export as GET …/export writes it (invented Larkspur T-62 study). */
function exportDocument(cells: unknown[] = [{ cellId: 'c1', kind: 'flow', title: 'Cruise', inputs: { mach: 0.2 }, output: null }]) {
  return {
    format: STUDY_DOCUMENT_FORMAT,
    study: { id: 'abc', title: 'Larkspur T-62 wing root (invented)' },
    source: { kind: 'version', branchId: null, branchName: null, versionId: 'v1', versionNumber: 3 },
    exportedAt: '2026-12-01T10:00:00Z',
    engineVersion: '1.2.0',
    caution: 'Engineering estimates.',
    cells,
  };
}

describe('readStudyFile (Import a study)', () => {
  it('reads a study export', () => {
    const reading = readStudyFile('root.json', JSON.stringify(exportDocument()));
    expect(reading.ok && reading.document.cells).toHaveLength(1);
  });

  it('names the file and what is wrong: not JSON, not an export, or the field at fault in words', () => {
    expect(readStudyFile('cp.csv', 'x/c,Cp\n0,1')).toEqual({ ok: false, message: '“cp.csv” is not a study export: it is not JSON text.' });
    expect(readStudyFile('pkg.json', '{"name":"x"}')).toEqual({
      ok: false,
      message: `“pkg.json” is not a study export: a Laminote study export says "format": "${STUDY_DOCUMENT_FORMAT}" at its top.`,
    });
    const reading = readStudyFile('cut.json', JSON.stringify(exportDocument([{ cellId: 'c1', kind: 'flow', inputs: {} }, { cellId: 'c2', kind: 'note' }])));
    expect(reading.ok).toBe(false);
    expect(!reading.ok && reading.message).toMatch(/^“cut\.json” is a study export that cannot be read: cell 2, inputs: /);
  });
});

describe('StudyList: Import a study', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  async function renderAndChoose(name: string, text: string) {
    const fixture = TestBed.createComponent(StudyList);
    fixture.componentRef.setInput('projectId', PROJECT_ID);
    fixture.componentRef.setInput('mayEdit', true);
    fixture.detectChanges();
    http.expectOne((r) => r.url === `/api/projects/${PROJECT_ID}/studies`).flush([]);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(Array.from(el.querySelectorAll('button')).some((b) => b.textContent?.includes('Import a study'))).toBe(true);
    const input = el.querySelector<HTMLInputElement>('input[type="file"]')!;
    Object.defineProperty(input, 'files', { value: [Object.assign(new File([text], name, { type: 'application/json' }), { text: async () => text })], configurable: true });
    // (jsdom's File has no text(); a browser's has.)
    input.dispatchEvent(new Event('change'));
    return { fixture, el };
  }

  /** The import dialog, once it is open over the page. */
  async function dialog(fixture: { detectChanges(): void }) {
    return vi.waitFor(() => {
      fixture.detectChanges();
      const found = document.querySelector<HTMLElement>('lam-study-import-dialog');
      if (!found) throw new Error('no import dialog yet');
      return found;
    });
  }

  function submit(box: HTMLElement, fixture: { detectChanges(): void }) {
    Array.from(box.querySelectorAll('button')).find((b) => b.textContent?.includes('Import study'))!.click();
    fixture.detectChanges();
  }

  it('says what the export holds, lets the study be named, sends it, then opens the imported study', async () => {
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const { fixture } = await renderAndChoose('root.json', JSON.stringify(exportDocument()));
    const box = await dialog(fixture);
    expect(box.textContent).toContain('“root.json”: 1 cell from version 3 of “Larkspur T-62 wing root (invented)”, exported 2026-12-01.');
    const title = box.querySelector<HTMLInputElement>('input[formcontrolname="title"]')!;
    expect(title.value).toBe('Larkspur T-62 wing root (invented)');
    title.value = 'Wing root, second look (invented)';
    title.dispatchEvent(new Event('input'));
    submit(box, fixture);
    const post = await vi.waitFor(() => http.expectOne({ method: 'POST', url: `/api/projects/${PROJECT_ID}/studies/import` }));
    expect(post.request.body.document.study.title).toBe('Larkspur T-62 wing root (invented)');
    expect(post.request.body.title).toBe('Wing root, second look (invented)');
    post.flush({ studyId: STUDY_ID, branchId: BRANCH_ID, title: 'Wing root, second look (invented)', cellCount: 1, outputsKept: 0, outputsLeft: 0 });
    await vi.waitFor(() => expect(navigate).toHaveBeenCalledWith(['/studies', STUDY_ID]));
  });

  it('keeps the dialog open with the server’s words on the title when the title is refused', async () => {
    const { fixture } = await renderAndChoose('root.json', JSON.stringify(exportDocument()));
    const box = await dialog(fixture);
    submit(box, fixture);
    const post = await vi.waitFor(() => http.expectOne({ method: 'POST', url: `/api/projects/${PROJECT_ID}/studies/import` }));
    post.flush(problem(400, 'Invalid input', { errors: [{ field: 'title', message: 'title must be at most 200 characters' }] }), problemResponse(400, 'Bad Request'));
    await vi.waitFor(() => {
      fixture.detectChanges();
      expect(box.querySelector('mat-error')?.textContent).toContain('at most 200 characters');
    });
    expect(document.querySelector('lam-study-import-dialog')).not.toBeNull();
  });

  it('sends nothing when the dialog is cancelled', async () => {
    const { fixture } = await renderAndChoose('root.json', JSON.stringify(exportDocument()));
    const box = await dialog(fixture);
    Array.from(box.querySelectorAll('button')).find((b) => b.textContent?.includes('Cancel'))!.click();
    await vi.waitFor(() => {
      fixture.detectChanges();
      expect(document.querySelector('lam-study-import-dialog')).toBeNull();
    });
    http.expectNone(`/api/projects/${PROJECT_ID}/studies/import`);
  });

  it('says which file is not an export and sends nothing', async () => {
    const { fixture, el } = await renderAndChoose('taps.csv', 'x/c,Cp\n0,1');
    await vi.waitFor(() => {
      fixture.detectChanges();
      expect(el.querySelector('[role="alert"]')?.textContent).toContain('“taps.csv” is not a study export: it is not JSON text.');
    });
    http.expectNone(`/api/projects/${PROJECT_ID}/studies/import`);
  });

  it('shows the server’s reason when the import is refused', async () => {
    const { fixture, el } = await renderAndChoose('root.json', JSON.stringify(exportDocument([{ cellId: 'c1', kind: 'wingBox', inputs: {} }])));
    submit(await dialog(fixture), fixture);
    const post = await vi.waitFor(() => http.expectOne({ method: 'POST', url: `/api/projects/${PROJECT_ID}/studies/import` }));
    post.flush(problem(400, 'Invalid study export', { detail: 'cells[0].kind: unknown cell kind "wingBox"' }), problemResponse(400, 'Bad Request'));
    await vi.waitFor(() => {
      fixture.detectChanges();
      expect(el.querySelector('[role="alert"]')?.textContent).toContain('“root.json” was not imported: Invalid study export');
    });
  });
});
