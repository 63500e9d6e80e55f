import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { ApiReferenceApi, type OpenApiDocument, type OpenApiOperation } from './api-reference-api';

export interface ReferenceEntry {
  id: string;
  method: string;
  path: string;
  summary: string;
  scope: OpenApiOperation['x-token-scope'];
  parameters: { name: string; where: string; required: boolean }[];
  body: { contentType: string; schema: string | null } | null;
  status: string;
  answer: { contentType: string; schema: string | null } | null;
}

const SCOPE_WORDS: Record<OpenApiOperation['x-token-scope'], string> = { read: 'token: Read', run: 'token: Read and run', none: 'signed in only' };

function refName(schema: Record<string, unknown> | undefined): string | null {
  const ref = schema?.['$ref'];
  return typeof ref === 'string' ? ref.split('/').pop()! : null;
}

/** The document as the page lists it: by tag, each route with its parameters, body, answer and token scope. */
export function referenceEntries(doc: OpenApiDocument): { tag: string; entries: ReferenceEntry[] }[] {
  const entries: (ReferenceEntry & { tag: string })[] = [];
  for (const [path, ops] of Object.entries(doc.paths)) {
    for (const [method, o] of Object.entries(ops)) {
      const ok = Object.entries(o.responses).find(([code]) => code.startsWith('2') || code.startsWith('3'));
      const bodyContent = o.requestBody ? Object.entries(o.requestBody.content)[0] : undefined;
      const answerContent = ok?.[1].content ? Object.entries(ok[1].content)[0] : undefined;
      entries.push({
        id: `${method}-${path}`.replace(/[^A-Za-z0-9]+/g, '-'),
        tag: o.tags[0] ?? 'Other',
        method: method.toUpperCase(),
        path,
        summary: o.summary,
        scope: o['x-token-scope'],
        parameters: (o.parameters ?? []).map((p) => ({ name: p.name, where: p.in, required: p.required })),
        body: bodyContent ? { contentType: bodyContent[0], schema: refName(bodyContent[1].schema) } : null,
        status: ok?.[0] ?? '200',
        answer: answerContent ? { contentType: answerContent[0], schema: refName(answerContent[1].schema) } : null,
      });
    }
  }
  return doc.tags.map((t) => ({ tag: t.name, entries: entries.filter((e) => e.tag === t.name) })).filter((g) => g.entries.length > 0);
}

/**
 * The API reference, read from the server's OpenAPI 3.1 document: every route by resource, what it
 * takes and answers, and whether a personal API token reaches it; each schema opens in place.
 */
@Component({
  selector: 'lam-api-reference-page',
  imports: [MatProgressBarModule, ProblemBanner, RouterLink],
  templateUrl: './api-reference-page.html',
  styleUrl: './api-reference-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ApiReferencePage {
  private readonly api = inject(ApiReferenceApi);
  private readonly load = loader(() => 0, () => this.api.document());
  protected readonly state = this.load.state;
  protected readonly groups = computed(() => {
    const doc = this.state().value;
    return doc ? referenceEntries(doc) : [];
  });
  protected readonly scopeWords = SCOPE_WORDS;
  protected readonly documentUrl = this.api.documentUrl();

  protected schemaText(name: string): string {
    return JSON.stringify(this.state().value?.components.schemas[name] ?? {}, null, 2);
  }

  protected scrollTo(id: string): void {
    document.getElementById(id)?.scrollIntoView({ block: 'start' });
  }

  protected retry(): void {
    this.load.reload();
  }
}
