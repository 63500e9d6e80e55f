import type { Routes } from '@angular/router';
import { landingWhenSignedOut, requireSignIn } from './core/guards';
import { Landing } from './landing/landing';
import { NotFound } from './shared/not-found';
import { prefetchNotebook } from './notebook/prefetch';

const loadNotebookPage = () => import('./notebook/notebook-page');

/**
 * Starts fetching the code of the page an address opens, before the router gets to it (it first waits
 * for the sign-in check): a study opened from a link or a reload then needs no second round of fetches.
 */
export function prefetchRouteCode(path: string): void {
  if (/^\/studies\/[^/]+\/?$/.test(path)) prefetchNotebook();
}

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
    path: 'studies/:studyId',
    canActivate: [requireSignIn],
    loadComponent: () => loadNotebookPage().then((m) => m.NotebookPage),
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
