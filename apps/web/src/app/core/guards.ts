import { inject } from '@angular/core';
import { type CanActivateFn, Router } from '@angular/router';
import { Auth } from './auth';

/** Pages behind sign-in: a signed-out visitor goes to the landing page, which can bring them back. */
export const requireSignIn: CanActivateFn = (_route, state) => {
  const auth = inject(Auth);
  if (auth.signedIn()) return true;
  return inject(Router).createUrlTree(['/'], { queryParams: { returnTo: state.url } });
};

/** The landing page is for signed-out visitors; a signed-in person goes straight to their projects. */
export const landingWhenSignedOut: CanActivateFn = () => {
  const auth = inject(Auth);
  if (!auth.signedIn()) return true;
  return inject(Router).createUrlTree(['/projects']);
};
