import { InjectionToken } from '@angular/core';

/**
 * Where the API lives. The server serves the app and the API from one origin, so the default is a
 * relative path; keeping it relative also keeps Angular's anti-forgery header on every change request
 * (HttpClient only adds it to same-origin URLs).
 */
export const API_BASE = new InjectionToken<string>('API_BASE', { factory: () => '/api' });

/** Where the sign-in and sign-out endpoints live (same origin as the API). */
export const AUTH_BASE = new InjectionToken<string>('AUTH_BASE', { factory: () => '/auth' });
