import { bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { appConfig } from './app/app-config';
import { prefetchRouteCode } from './app/app-routes';

// The page's own code is fetched while the app starts and the sign-in is checked, not after.
prefetchRouteCode(location.pathname);

bootstrapApplication(App, appConfig).catch((error: unknown) => {
  // Nothing else can report a failed bootstrap: the app's own error handling is not running yet.
  console.error(error);
});
