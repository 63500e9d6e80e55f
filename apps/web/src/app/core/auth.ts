import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import type { Me, Problem } from '@laminote/contracts';
import { firstValueFrom } from 'rxjs';
import { API_BASE, AUTH_BASE } from './api-base';
import { checked, ContractDriftError } from './checked';
import { PageNavigation } from './page-navigation';
import { toProblem } from './problem';

/** Where the app stands with the signed-in person. */
export type AuthState =
  | { readonly status: 'unknown' }
  | { readonly status: 'signedOut' }
  | { readonly status: 'signedIn'; readonly me: Me }
  /** `/api/me` failed for a reason other than being signed out (server down, 5xx). */
  | { readonly status: 'unavailable'; readonly problem: Problem };

/** The signed-in person, loaded once at start; sign-in and sign-out are full-page trips to the server. */
@Injectable({ providedIn: 'root' })
export class Auth {
  private readonly http = inject(HttpClient);
  private readonly apiBase = inject(API_BASE);
  private readonly authBase = inject(AUTH_BASE);
  private readonly page = inject(PageNavigation);

  private readonly stateSignal = signal<AuthState>({ status: 'unknown' });

  readonly state = this.stateSignal.asReadonly();
  readonly me = computed(() => {
    const state = this.stateSignal();
    return state.status === 'signedIn' ? state.me : null;
  });
  readonly signedIn = computed(() => this.me() !== null);

  /** Asks the server who is signed in. Never rejects (but for a contract drift in development): a failure becomes the `unavailable` state. */
  async load(): Promise<void> {
    try {
      const me = await firstValueFrom(this.http.get(`${this.apiBase}/me`).pipe(checked('me', 'the signed-in person')));
      this.stateSignal.set({ status: 'signedIn', me });
    } catch (error) {
      // A contract drift (development builds and unit tests only) is a defect to see, not an outage.
      if (error instanceof ContractDriftError) throw error;
      if (error instanceof HttpErrorResponse && error.status === 401) {
        this.stateSignal.set({ status: 'signedOut' });
      } else {
        this.stateSignal.set({ status: 'unavailable', problem: toProblem(error) });
      }
    }
  }

  /** The server said the session is gone (expired, signed out elsewhere). */
  sessionEnded(): void {
    this.stateSignal.set({ status: 'signedOut' });
  }

  /** Starts the OpenID Connect sign-in; the server brings the browser back to `returnTo`. */
  signIn(returnTo = '/projects'): void {
    const target = returnTo.startsWith('/') && !returnTo.startsWith('//') ? returnTo : '/projects';
    this.page.assign(`${this.authBase}/login?returnTo=${encodeURIComponent(target)}`);
  }

  /** Ends the session here and at the provider, whose end-session page the server names. */
  async signOut(): Promise<void> {
    const { redirectTo } = await firstValueFrom(this.http.post(`${this.authBase}/logout`, {}).pipe(checked('signedOut', 'signing out')));
    this.stateSignal.set({ status: 'signedOut' });
    this.page.assign(redirectTo);
  }
}
