import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { CreateToken, CreatedToken, TokenSummary } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';

/** The signed-in person's personal API tokens. */
@Injectable({ providedIn: 'root' })
export class TokensApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  list(): Observable<TokenSummary[]> {
    return this.http.get<TokenSummary[]>(`${this.base}/me/tokens`);
  }

  create(input: CreateToken): Observable<CreatedToken> {
    return this.http.post<CreatedToken>(`${this.base}/me/tokens`, input);
  }

  revoke(tokenId: string): Observable<TokenSummary> {
    return this.http.delete<TokenSummary>(`${this.base}/me/tokens/${encodeURIComponent(tokenId)}`);
  }
}
