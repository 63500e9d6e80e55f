import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CreateToken, CreatedToken, TokenSummary } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';

/** The signed-in person's personal API tokens. */
@Injectable({ providedIn: 'root' })
export class TokensApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  list(): Observable<TokenSummary[]> {
    return this.http.get(`${this.base}/me/tokens`).pipe(checked('tokens', 'the API tokens'));
  }

  create(input: CreateToken): Observable<CreatedToken> {
    return this.http.post(`${this.base}/me/tokens`, input).pipe(checked('createdToken', 'a new API token'));
  }

  revoke(tokenId: string): Observable<TokenSummary> {
    return this.http.delete(`${this.base}/me/tokens/${encodeURIComponent(tokenId)}`).pipe(checked('token', 'a revoked API token'));
  }
}
