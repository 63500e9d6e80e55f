import { type Signal, computed, inject } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { catchError, map, of, switchMap } from 'rxjs';
import { Auth } from '../core/auth';
import { ProjectApi } from './project-api';

/**
 * A project's name for a page's breadcrumb: from the person's memberships when they are in the
 * project, else (a site admin) from the project itself; null until known. Call in an injection context.
 */
export function projectNameOf(projectId: () => string | null): Signal<string | null> {
  const projects = inject(ProjectApi);
  const auth = inject(Auth);
  const known = computed(() => {
    const id = projectId();
    return id ? (auth.me()?.memberships.find((m) => m.projectId === id)?.projectName ?? null) : null;
  });
  const fetched$ = toObservable(computed(() => (known() === null ? projectId() : null))).pipe(
    switchMap((id) =>
      id
        ? projects.get(id).pipe(
            map((project) => project.name),
            catchError(() => of(null)),
          )
        : of(null),
    ),
  );
  const fetched = toSignal(fetched$, { initialValue: null });
  return computed(() => known() ?? fetched());
}
