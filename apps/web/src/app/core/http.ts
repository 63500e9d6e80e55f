import { provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import type { EnvironmentProviders } from '@angular/core';
import { earlyReadsInterceptor } from './early-reads';
import { sessionInterceptor } from './session-interceptor';

/**
 * HttpClient as the server expects it: the anti-forgery token from the readable `XSRF-TOKEN` cookie goes
 * back as `X-XSRF-TOKEN` on every POST, PATCH, PUT and DELETE, and an ended session sends the person to
 * the landing page. The app's first reads are answered from what `early-reads.js` fetched before the app
 * started (core/early-reads.ts).
 */
export function provideLaminoteHttp(): EnvironmentProviders {
  return provideHttpClient(
    withXsrfConfiguration({ cookieName: 'XSRF-TOKEN', headerName: 'X-XSRF-TOKEN' }),
    withInterceptors([sessionInterceptor, earlyReadsInterceptor]),
  );
}
