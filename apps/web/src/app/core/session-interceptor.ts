import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { API_BASE } from './api-base';
import { Auth } from './auth';

/**
 * A 401 from any API call after start means the session ended: the app forgets the person and goes to
 * the landing page, which offers to sign in again and come back here. The start-up `/api/me` call is
 * left to `Auth.load`, which expects 401 when nobody is signed in.
 */
export const sessionInterceptor: HttpInterceptorFn = (request, next) => {
  const auth = inject(Auth);
  const router = inject(Router);
  const apiBase = inject(API_BASE);
  return next(request).pipe(
    catchError((error: unknown) => {
      const isApi = request.url.startsWith(`${apiBase}/`);
      const isStartUp = request.url === `${apiBase}/me`;
      if (error instanceof HttpErrorResponse && error.status === 401 && isApi && !isStartUp && auth.signedIn()) {
        const returnTo = router.url;
        auth.sessionEnded();
        void router.navigate(['/'], { queryParams: { returnTo, reason: 'session-ended' } });
      }
      return throwError(() => error);
    }),
  );
};
