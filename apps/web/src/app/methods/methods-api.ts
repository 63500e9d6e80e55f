import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { ValidationReport } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';

/** The engine's validation cases, run on the server. (The methods themselves ship with the app.) */
@Injectable({ providedIn: 'root' })
export class MethodsApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  validation(): Observable<ValidationReport> {
    return this.http.get(`${this.base}/methods/validation`).pipe(checked('validationReport', 'the validation report'));
  }
}
