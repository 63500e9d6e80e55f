import { HttpErrorResponse, type HttpEvent, HttpHeaders, type HttpInterceptorFn, HttpResponse } from '@angular/common/http';
import { type Observable, from, switchMap, throwError } from 'rxjs';

/** One answer read by `early-reads.js` before the app started. */
export interface EarlyAnswer {
  readonly status: number;
  readonly statusText: string;
  readonly contentType: string | null;
  readonly body: string;
}

/** What `early-reads.js` leaves on the window: the reads it started, by address. */
export interface EarlyReads {
  readonly startedAt: number;
  readonly reads: Map<string, Promise<EarlyAnswer>>;
}

declare global {
  interface Window {
    laminoteEarlyReads?: EarlyReads;
  }
}

/** An early read not taken by then is left alone: the app asks the server itself. */
export const EARLY_READ_FRESH_MS = 15_000;

/**
 * Answers the app's first reads (who is signed in; on a study's address the study, its branches and its
 * draft) with what `early-reads.js` fetched while the app's code was arriving. Each early answer serves
 * one GET of the same address, once and only while fresh; everything else goes to the server. Last in the
 * chain, so an early answer passes through the other interceptors as the server's own would.
 */
export const earlyReadsInterceptor: HttpInterceptorFn = (request, next) => {
  const early = typeof window === 'undefined' ? undefined : window.laminoteEarlyReads;
  if (!early || request.method !== 'GET' || request.responseType !== 'json') return next(request);
  const url = request.urlWithParams;
  const answer = early.reads.get(url);
  if (!answer) return next(request);
  early.reads.delete(url);
  if (Date.now() - early.startedAt > EARLY_READ_FRESH_MS) return next(request);
  // A read that failed on the way (no answer at all) is asked again.
  const settled = answer.then(
    (a) => a,
    () => null,
  );
  return from(settled).pipe(switchMap((a) => (a ? replay(a, url) : next(request))));
};

/** The early answer as HttpClient's own backend would give it: a parsed body, or an error response. */
function replay(answer: EarlyAnswer, url: string): Observable<HttpEvent<unknown>> {
  const headers = new HttpHeaders(answer.contentType ? { 'content-type': answer.contentType } : {});
  let body: unknown = answer.body;
  if (answer.body !== '') {
    try {
      body = JSON.parse(answer.body);
    } catch {
      // The backend hands on an unreadable error body as text; an unreadable 2xx body is an error.
      if (answer.status >= 200 && answer.status < 300) {
        return throwError(() => new HttpErrorResponse({ error: { error: new SyntaxError('unreadable JSON'), text: answer.body }, headers, status: answer.status, statusText: answer.statusText, url }));
      }
    }
  } else {
    body = null;
  }
  if (answer.status >= 200 && answer.status < 300) {
    return from([new HttpResponse({ body, headers, status: answer.status, statusText: answer.statusText, url })]);
  }
  return throwError(() => new HttpErrorResponse({ error: body, headers, status: answer.status, statusText: answer.statusText, url }));
}
