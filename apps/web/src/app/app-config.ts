import {
  type ApplicationConfig,
  inject,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { provideRouter, withComponentInputBinding, withInMemoryScrolling } from '@angular/router';
import { Auth } from './core/auth';
import { provideLaminoteHttp } from './core/http';
import { routes } from './app-routes';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideLaminoteHttp(),
    provideRouter(routes, withComponentInputBinding(), withInMemoryScrolling({ scrollPositionRestoration: 'top' })),
    // The router's guards need to know who is signed in before the first navigation.
    provideAppInitializer(() => {
      inject(MatIconRegistry).setDefaultFontSetClass('lam-symbols');
      return inject(Auth).load();
    }),
  ],
};
