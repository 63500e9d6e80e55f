import type { Routes } from '@angular/router';
import { landingWhenSignedOut, requireSignIn } from './core/guards';
import { Landing } from './landing/landing';
import { NotFound } from './shared/not-found';
import { NotebookPage } from './notebook/notebook-page';

export const routes: Routes = [
  { path: '', pathMatch: 'full', component: Landing, canActivate: [landingWhenSignedOut], title: 'Laminote' },
  {
    path: 'projects',
    canActivate: [requireSignIn],
    loadComponent: () => import('./projects/project-list').then((m) => m.ProjectList),
    title: 'Projects · Laminote',
  },
  {
    path: 'projects/:projectId',
    canActivate: [requireSignIn],
    loadComponent: () => import('./project/project-page').then((m) => m.ProjectPage),
    title: 'Project · Laminote',
  },
  {
    path: 'studies/:studyId/compare',
    canActivate: [requireSignIn],
    loadComponent: () => import('./versions/compare-page').then((m) => m.ComparePage),
    title: 'Compare versions · Laminote',
  },
  {
    path: 'studies/:studyId/versions/:versionId',
    canActivate: [requireSignIn],
    loadComponent: () => import('./versions/version-page').then((m) => m.VersionPage),
    title: 'Version · Laminote',
  },
  {
    // The notebook comes with the app's own code rather than on first use, unlike the other pages: it is
    // the page people open from links, mail and bookmarks. Fetched apart, its code came as the dozens of
    // small scripts it shares with the pages and bodies fetched on first use, which a cold open fetched
    // one after another over the browser's six connections; in main they are one file. A/B, 8 + 8 cold
    // opens of a 20-cell study: median 1118 → 1015 ms; the projects list opened cold as fast as before
    // (636 and 633 ms, 6 + 6). Issue 15.
    path: 'studies/:studyId',
    canActivate: [requireSignIn],
    component: NotebookPage,
    title: 'Study · Laminote',
  },
  {
    path: 'methods/validation',
    canActivate: [requireSignIn],
    loadComponent: () => import('./methods/validation-page').then((m) => m.ValidationPage),
    title: 'Validation · Laminote',
  },
  {
    path: 'methods/:methodId',
    canActivate: [requireSignIn],
    loadComponent: () => import('./methods/methods-page').then((m) => m.MethodsPage),
    title: 'Method · Laminote',
  },
  {
    path: 'methods',
    canActivate: [requireSignIn],
    loadComponent: () => import('./methods/methods-page').then((m) => m.MethodsPage),
    title: 'Methods · Laminote',
  },
  {
    path: 'api-reference',
    canActivate: [requireSignIn],
    loadComponent: () => import('./api-reference/api-reference-page').then((m) => m.ApiReferencePage),
    title: 'API reference · Laminote',
  },
  {
    path: 'settings/tokens',
    canActivate: [requireSignIn],
    loadComponent: () => import('./settings/tokens-page').then((m) => m.TokensPage),
    title: 'API tokens · Laminote',
  },
  {
    path: 'inbox',
    canActivate: [requireSignIn],
    loadComponent: () => import('./inbox/inbox-page').then((m) => m.InboxPage),
    title: 'Inbox · Laminote',
  },
  {
    path: 'dev/mail',
    canActivate: [requireSignIn],
    loadComponent: () => import('./inbox/dev-mail-page').then((m) => m.DevMailPage),
    title: 'Development mail · Laminote',
  },
  { path: '**', component: NotFound, data: { subject: 'page' }, title: 'Not found · Laminote' },
];
