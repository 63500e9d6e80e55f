import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  OTHER_PROJECT_ID,
  me,
  problem,
  problemResponse,
  project,
  provideTestApp,
  signInAs,
} from '../../testing/test-app';
import { ProjectList } from './project-list';

describe('ProjectList', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  async function render() {
    const fixture = TestBed.createComponent(ProjectList);
    fixture.detectChanges();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture), root: TestbedHarnessEnvironment.documentRootLoader(fixture) };
  }

  it('lists the projects with the person’s role and the study and member counts', async () => {
    await signInAs(me());
    const { fixture, loader } = await render();
    http.expectOne('/api/projects').flush([
      project({ role: 'lead', studyCount: 12, memberCount: 7 }),
      project({ id: OTHER_PROJECT_ID, name: 'Larkspur T-62 nacelle', role: 'viewer', studyCount: 0, memberCount: 3 }),
    ]);
    await fixture.whenStable();

    const heading = (fixture.nativeElement as HTMLElement).querySelector('h1');
    expect(heading?.textContent).toBe('Projects');
    const table = await loader.getHarness(MatTableHarness);
    const rows = await table.getCellTextByColumnName();
    expect(rows['role'].text).toEqual(['Lead', 'Viewer']);
    expect(rows['studies'].text).toEqual(['12', '0']);
    expect(rows['members'].text).toEqual(['7', '3']);
    expect(rows['name'].text[1]).toContain('Larkspur T-62 nacelle');
    // People who are not site admins do not open projects.
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New project/ }))).toHaveLength(0);
  });

  it('shows a site admin who is not a member as such', async () => {
    await signInAs(me({ siteAdmin: true }));
    const { fixture, loader } = await render();
    http.expectOne('/api/projects').flush([project({ role: null })]);
    await fixture.whenStable();
    const rows = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(rows['role'].text).toEqual(['Site admin']);
  });

  it('says there are no projects yet rather than showing an empty table', async () => {
    await signInAs(me());
    const { fixture, loader } = await render();
    http.expectOne('/api/projects').flush([]);
    await fixture.whenStable();
    expect(await loader.getAllHarnesses(MatTableHarness)).toHaveLength(0);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('not a member of any project yet');
  });

  it('lets a site admin open a project, with the server’s message on the field at fault', async () => {
    await signInAs(me({ siteAdmin: true }));
    const { fixture, loader, root } = await render();
    http.expectOne('/api/projects').flush([]);
    await fixture.whenStable();

    await (await loader.getHarness(MatButtonHarness.with({ text: /New project/ }))).click();
    const dialog = await root.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="name"]' }))).setValue('Larkspur T-62 tail');
    await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="leadEmail"]' }))).setValue('nobody@tamsk.example');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create project' }))).click();

    const create = http.expectOne({ method: 'POST', url: '/api/projects' });
    expect(create.request.body).toEqual({ name: 'Larkspur T-62 tail', description: '', leadEmail: 'nobody@tamsk.example' });
    create.flush(
      problem(400, 'Invalid request', { errors: [{ field: 'leadEmail', message: 'no user with this e-mail address' }] }),
      problemResponse(400, 'Bad Request'),
    );
    await fixture.whenStable();
    const leadField = await dialog.getHarness(MatFormFieldHarness.with({ floatingLabelText: "Lead's e-mail" }));
    expect(await leadField.getTextErrors()).toEqual(['no user with this e-mail address']);

    // Fixing the field and submitting again creates the project and opens it.
    await (await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName="leadEmail"]' }))).setValue('oskar.lind@tamsk.example');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create project' }))).click();
    http.expectOne({ method: 'POST', url: '/api/projects' }).flush(project({ id: OTHER_PROJECT_ID, name: 'Larkspur T-62 tail', role: null }));
    await fixture.whenStable();
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    expect(TestBed.inject(Router).url).toBe(`/projects/${OTHER_PROJECT_ID}`);
  });
});
