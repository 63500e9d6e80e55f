import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PROJECT_ID, STUDY_ID, problem, problemResponse, provideTestApp, study } from '../../testing/test-app';
import { StudyList } from './study-list';

const studiesUrl = `/api/projects/${PROJECT_ID}/studies`;

describe('StudyList', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  async function render(mayEdit: boolean) {
    const fixture = TestBed.createComponent(StudyList);
    fixture.componentRef.setInput('projectId', PROJECT_ID);
    fixture.componentRef.setInput('mayEdit', mayEdit);
    fixture.detectChanges();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const root = TestbedHarnessEnvironment.documentRootLoader(fixture);
    return { fixture, loader, root };
  }

  function expectList(archived: boolean) {
    return http.expectOne((request) => request.url === studiesUrl && request.params.get('archived') === String(archived));
  }

  it('lists the studies, each linking to its notebook', async () => {
    const { fixture, loader } = await render(false);
    expectList(false).flush([study(), study({ id: '0f1e2d3c-4b5a-4968-8776-655443322110', title: 'Low-speed approach' })]);
    await fixture.whenStable();

    const rows = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(rows['title'].text.map((t) => t.split('\n')[0])).toEqual([
      expect.stringContaining('Cruise upper surface, M 0.78'),
      expect.stringContaining('Low-speed approach'),
    ]);
    const link = (fixture.nativeElement as HTMLElement).querySelector<HTMLAnchorElement>('a.study-link');
    expect(link?.getAttribute('href')).toBe(`/studies/${STUDY_ID}`);
    // A reader has no way to change studies.
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New study/ }))).toHaveLength(0);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ selector: '[aria-label^="Actions for"]' }))).toHaveLength(0);
  });

  it('adds the archived studies below the active ones when the toggle is on', async () => {
    const { fixture, loader } = await render(false);
    expectList(false).flush([study()]);
    await fixture.whenStable();
    await (await loader.getHarness(MatSlideToggleHarness.with({ label: /Show archived/ }))).toggle();
    expectList(true).flush([study({ id: '0f1e2d3c-4b5a-4968-8776-655443322110', title: 'Old tip', archived: true })]);
    expectList(false).flush([study()]);
    await fixture.whenStable();
    const rows = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(rows['title'].text).toHaveLength(2);
    expect(rows['title'].text[0]).toContain('Cruise upper surface, M 0.78');
    expect(rows['title'].text[0]).not.toContain('Archived');
    expect(rows['title'].text[1]).toContain('Old tip');
    expect(rows['title'].text[1]).toContain('Archived');
  });

  it('creates a study through the dialog and keeps it open with the server’s field error', async () => {
    const { fixture, loader, root } = await render(true);
    expectList(false).flush([]);
    await fixture.whenStable();

    await (await loader.getHarness(MatButtonHarness.with({ text: /New study/ }))).click();
    const dialog = await root.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('New study');
    await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="title"]' }))).setValue('Cruise upper surface, M 0.78');
    await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="description"]' }))).setValue('Tamsk wind-tunnel taps');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create study' }))).click();

    const create = http.expectOne({ method: 'POST', url: studiesUrl });
    expect(create.request.body).toEqual({ title: 'Cruise upper surface, M 0.78', description: 'Tamsk wind-tunnel taps' });
    create.flush(
      problem(400, 'Invalid study', { field: 'title', detail: 'a study with this title already exists in the project' }),
      problemResponse(400, 'Bad Request'),
    );
    await fixture.whenStable();

    const titleField = await dialog.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Title' }));
    expect(await titleField.getTextErrors()).toEqual(['a study with this title already exists in the project']);
    // Nothing the user typed is lost.
    expect(await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="description"]' }))).getValue()).toBe(
      'Tamsk wind-tunnel taps',
    );
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(1);
  });

  it('closes the dialog and opens the new study once the server has it', async () => {
    const { fixture, loader, root } = await render(true);
    expectList(false).flush([]);
    await fixture.whenStable();
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);

    await (await loader.getHarness(MatButtonHarness.with({ text: /New study/ }))).click();
    const dialog = await root.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="title"]' }))).setValue('Cruise upper surface, M 0.78');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create study' }))).click();
    http.expectOne({ method: 'POST', url: studiesUrl }).flush(study());
    await fixture.whenStable();

    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    // The person lands in the new study's notebook, not back on the list.
    expect(navigate).toHaveBeenCalledWith(['/studies', STUDY_ID]);
  });

  it('renames and archives a study from its menu', async () => {
    const { fixture, loader, root } = await render(true);
    expectList(false).flush([study()]);
    await fixture.whenStable();

    const menu = await loader.getHarness(
      MatMenuHarness.with({ selector: '[aria-label="Actions for Cruise upper surface, M 0.78"]' }),
    );
    await menu.clickItem({ text: /Rename/ });
    const dialog = await root.getHarness(MatDialogHarness);
    const title = await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="title"]' }));
    expect(await title.getValue()).toBe('Cruise upper surface, M 0.78');
    await title.setValue('Cruise upper surface, M 0.80');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save' }))).click();
    const rename = http.expectOne({ method: 'PATCH', url: `/api/studies/${STUDY_ID}` });
    expect(rename.request.body).toEqual({ title: 'Cruise upper surface, M 0.80', description: 'Invented Cp distribution at cruise.' });
    rename.flush(study({ title: 'Cruise upper surface, M 0.80' }));
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    expectList(false).flush([study({ title: 'Cruise upper surface, M 0.80' })]);
    await fixture.whenStable();

    const renamedMenu = await loader.getHarness(
      MatMenuHarness.with({ selector: '[aria-label="Actions for Cruise upper surface, M 0.80"]' }),
    );
    await renamedMenu.clickItem({ text: /Archive/ });
    const archive = http.expectOne({ method: 'PATCH', url: `/api/studies/${STUDY_ID}` });
    expect(archive.request.body).toEqual({ archived: true });
    archive.flush(study({ archived: true }));
    await fixture.whenStable();
    expectList(false).flush([]);
  });
});
