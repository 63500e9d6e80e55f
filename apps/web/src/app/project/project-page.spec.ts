import { TestBed } from '@angular/core/testing';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import type { HarnessLoader } from '@angular/cdk/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { MatTabGroupHarness } from '@angular/material/tabs/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Me, Project } from '@laminote/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  PROJECT_ID,
  me,
  member,
  problem,
  problemResponse,
  project,
  provideTestApp,
  signInAs,
  study,
} from '../../testing/test-app';

const projectUrl = `/api/projects/${PROJECT_ID}`;
const membersUrl = `${projectUrl}/members`;
const studiesUrl = `${projectUrl}/studies`;

describe('ProjectPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: provideTestApp() });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  /** Opens the project page as `person`, answering the project request with `answer`. */
  async function open(person: Me, answer: Project) {
    await signInAs(person);
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(`/projects/${PROJECT_ID}`);
    await harness.fixture.whenStable();
    http.expectOne(projectUrl).flush(answer);
    await navigation;
    await harness.fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    // The studies tab opens first.
    http.expectOne((request) => request.url === studiesUrl).flush([study()]);
    await harness.fixture.whenStable();
    return { harness, loader, root: TestbedHarnessEnvironment.documentRootLoader(harness.fixture) };
  }

  async function openMembersTab(loader: HarnessLoader) {
    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label: 'Members' });
    http.expectOne(membersUrl).flush([
      member(),
      member({ userId: '1b2c3d4e-5f60-4718-89a0-b1c2d3e4f506', name: 'Ines Varga', email: 'ines.varga@tamsk.example', role: 'engineer' }),
      member({ userId: '2c3d4e5f-6071-4829-9ab0-c1d2e3f40617', name: '', email: 'new.reviewer@tamsk.example', role: 'reviewer', hasSignedIn: false }),
    ]);
  }

  it('shows the project, the person’s role and its studies', async () => {
    const { harness, loader } = await open(me(), project());
    const page = harness.routeNativeElement as HTMLElement;
    expect(page.querySelector('h1')?.textContent).toBe('Larkspur T-62 wing');
    expect(page.textContent).toContain('Your role: Engineer');
    const rows = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(rows['title'].text[0]).toContain('Cruise upper surface, M 0.78');
    // An engineer creates studies but does not run the project.
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New study/ }))).toHaveLength(1);
    const tabs = await (await loader.getHarness(MatTabGroupHarness)).getTabs();
    expect(await Promise.all(tabs.map((tab) => tab.getLabel()))).toEqual(['Studies', 'Members']);
  });

  it('gives a viewer a read-only studies list and a read-only members tab', async () => {
    const { loader } = await open(me(), project({ role: 'viewer' }));
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New study/ }))).toHaveLength(0);

    await openMembersTab(loader);
    const table = await loader.getHarness(MatTableHarness);
    const rows = await table.getCellTextByColumnName();
    expect(rows['role'].text).toEqual(['Lead', 'Engineer', 'Reviewer']);
    expect(rows['email'].text[2]).toBe('new.reviewer@tamsk.example');
    expect(Object.keys(rows)).not.toContain('actions');
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Add member/ }))).toHaveLength(0);
    expect(await loader.getAllHarnesses(MatSelectHarness)).toHaveLength(0);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ selector: '[aria-label^="Remove"]' }))).toHaveLength(0);
  });

  it('lets a lead add a member, change a role and remove a member', async () => {
    const { harness, loader, root } = await open(me(), project({ role: 'lead' }));
    await openMembersTab(loader);

    // Add by e-mail with a role; the server's message lands on the e-mail field.
    await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="email"]' }))).setValue('ines.varga@tamsk.example');
    const roleSelect = await loader.getHarness(MatSelectHarness.with({ selector: '[formControlName="role"]' }));
    await roleSelect.open();
    await roleSelect.clickOptions({ text: 'Reviewer' });
    await (await loader.getHarness(MatButtonHarness.with({ text: /Add member/ }))).click();
    const add = http.expectOne({ method: 'POST', url: membersUrl });
    expect(add.request.body).toEqual({ email: 'ines.varga@tamsk.example', role: 'reviewer' });
    add.flush(problem(409, 'Already a member', { field: 'email', detail: 'ines.varga@tamsk.example is already in this project' }), problemResponse(409, 'Conflict'));
    const emailField = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'E-mail' }));
    expect(await emailField.getTextErrors()).toEqual(['ines.varga@tamsk.example is already in this project']);

    // Change a role in place.
    const inesRole = await loader.getHarness(MatSelectHarness.with({ selector: '[aria-label="Role of Ines Varga"]' }));
    await inesRole.open();
    await inesRole.clickOptions({ text: 'Lead' });
    const change = http.expectOne({ method: 'PATCH', url: `${membersUrl}/1b2c3d4e-5f60-4718-89a0-b1c2d3e4f506` });
    expect(change.request.body).toEqual({ role: 'lead' });
    change.flush(member({ userId: '1b2c3d4e-5f60-4718-89a0-b1c2d3e4f506', name: 'Ines Varga', role: 'lead' }));
    await harness.fixture.whenStable();
    http.expectOne(membersUrl).flush([member()]);

    // Remove, after confirming.
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Remove Oskar Lind"]' }))).click();
    const confirm = await root.getHarness(MatDialogHarness);
    await (await confirm.getHarness(MatButtonHarness.with({ text: 'Remove' }))).click();
    http.expectOne({ method: 'DELETE', url: `${membersUrl}/9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d` }).flush(null, { status: 204, statusText: 'No Content' });
    expect(await root.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    http.expectOne(membersUrl).flush([]);
  });

  it('gives a site admin who is not a member the members and settings tabs but no study editing', async () => {
    const { loader } = await open(me({ siteAdmin: true }), project({ role: null }));
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New study/ }))).toHaveLength(0);
    const tabs = await (await loader.getHarness(MatTabGroupHarness)).getTabs();
    expect(await Promise.all(tabs.map((tab) => tab.getLabel()))).toEqual(['Studies', 'Members', 'Settings']);
    await openMembersTab(loader);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Add member/ }))).toHaveLength(1);
  });

  it('lets a lead allow engineers to branch', async () => {
    const { loader } = await open(me(), project({ role: 'lead' }));
    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label: 'Settings' });
    const toggle = await loader.getHarness(MatSlideToggleHarness.with({ label: /Engineers may branch/ }));
    expect(await toggle.isChecked()).toBe(false);
    await toggle.toggle();
    const update = http.expectOne({ method: 'PATCH', url: projectUrl });
    expect(update.request.body).toEqual({ settings: { engineersMayBranch: true } });
    update.flush(project({ role: 'lead', settings: { engineersMayBranch: true } }));
    expect(await toggle.isChecked()).toBe(true);
  });

  it('puts the setting back when the server refuses it', async () => {
    const { loader } = await open(me(), project({ role: 'lead' }));
    await (await loader.getHarness(MatTabGroupHarness)).selectTab({ label: 'Settings' });
    const toggle = await loader.getHarness(MatSlideToggleHarness.with({ label: /Engineers may branch/ }));
    await toggle.toggle();
    http.expectOne({ method: 'PATCH', url: projectUrl }).flush(problem(403, 'Only leads change settings'), problemResponse(403, 'Forbidden'));
    expect(await toggle.isChecked()).toBe(false);
  });

  it('answers a project that is missing or not shared with a calm not-found page', async () => {
    await signInAs(me());
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(`/projects/${PROJECT_ID}`);
    await harness.fixture.whenStable();
    http.expectOne(projectUrl).flush(problem(404, 'Not found'), problemResponse(404, 'Not Found'));
    await navigation;
    await harness.fixture.whenStable();
    const page = harness.routeNativeElement as HTMLElement;
    expect(page.querySelector('h1')?.textContent).toBe('Project not found or not shared with you');
    expect(page.querySelector('a[href="/projects"]')?.textContent).toContain('Back to your projects');
    expect(page.querySelector('[role="alert"]')).toBeNull();
  });

  it('offers to try again when the project cannot be loaded', async () => {
    await signInAs(me());
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(`/projects/${PROJECT_ID}`);
    await harness.fixture.whenStable();
    http.expectOne(projectUrl).flush(problem(500, 'Internal error', { detail: 'request id 42' }), problemResponse(500, 'Server Error'));
    await navigation;
    await harness.fixture.whenStable();
    const page = harness.routeNativeElement as HTMLElement;
    expect(page.querySelector('[role="alert"]')?.textContent).toContain('Internal error: request id 42');
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Try again' }))).click();
    http.expectOne(projectUrl).flush(project());
    await harness.fixture.whenStable();
    http.expectOne((request) => request.url === studiesUrl).flush([]);
    expect(page.querySelector('h1')?.textContent).toBe('Larkspur T-62 wing');
  });
});
