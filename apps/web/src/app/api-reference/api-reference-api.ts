import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';

/** The parts of an OpenAPI 3.1 document the reference page reads. */
export interface OpenApiOperation {
  summary: string;
  tags: string[];
  parameters?: { name: string; in: 'path' | 'query'; required: boolean; schema: Record<string, unknown> }[];
  requestBody?: { content: Record<string, { schema?: Record<string, unknown> }> };
  responses: Record<string, { description: string; content?: Record<string, { schema?: Record<string, unknown> }> }>;
  'x-token-scope': 'read' | 'run' | 'none';
}

export interface OpenApiDocument {
  openapi: string;
  info: { title: string; version: string; description: string };
  tags: { name: string }[];
  paths: Record<string, Record<string, OpenApiOperation>>;
  components: { schemas: Record<string, Record<string, unknown>> };
}

/** The API's own description (GET /api/openapi.json). */
@Injectable({ providedIn: 'root' })
export class ApiReferenceApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  document(): Observable<OpenApiDocument> {
    return this.http.get<OpenApiDocument>(`${this.base}/openapi.json`);
  }

  /** Where the document itself is, for people and tools that read it whole. */
  documentUrl(): string {
    return `${this.base}/openapi.json`;
  }
}
