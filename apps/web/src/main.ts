import { bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { appConfig } from './app/app-config';

bootstrapApplication(App, appConfig).catch((error: unknown) => {
  // Nothing else can report a failed bootstrap: the app's own error handling is not running yet.
  console.error(error);
});
