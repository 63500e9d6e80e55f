import { ChangeDetectionStrategy, Component, InjectionToken, PendingTasks, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { METHOD_NAMES, isMethodId } from '@laminote/aero/methods/method-names';
import { resultMethodIds } from '@laminote/aero/methods/result-method-ids';
import type { CellOutput } from '@laminote/contracts';
import { type LazyModule, lazyModule } from '../shared/lazy-module';

type Catalogue = typeof import('@laminote/aero/methods/result-methods');

/** The methods catalogue (every method's purpose, formula and sources), fetched once, after the first screen. */
export const METHOD_CATALOGUE = new InjectionToken<LazyModule<Catalogue>>('methods catalogue', {
  providedIn: 'root',
  factory: () => lazyModule(() => import('@laminote/aero/methods/result-methods')),
});

/**
 * The "Methods" line under a cell's result: one link per method its numbers come from, to the page with
 * the formula, symbols, validity, sources and limits — so every number on the screen can be traced.
 * The same list the report prints per cell (`resultMethods` in libs/aero). The links are drawn with the
 * result: which methods a result has, and their names, are known without the catalogue. The catalogue
 * loads apart from the first screen and only adds each link's one-sentence purpose (its title), so the
 * line does not change size when it comes.
 */
@Component({
  selector: 'lam-method-links',
  imports: [RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (methods().length > 0) {
      <p class="method-links">
        <span class="method-links-label">Methods</span>
        @for (method of methods(); track method.id) {
          <a [routerLink]="['/methods', method.id]" [attr.title]="purposes()?.get(method.id) ?? null">{{ method.name }}</a>
        }
      </p>
    }
  `,
  styles: `
    .method-links {
      display: flex;
      flex-wrap: wrap;
      align-items: baseline;
      gap: 2px 12px;
      margin: 8px 0 0;
      font-size: 0.8125rem;
      color: var(--mat-sys-on-surface-variant);
    }
    .method-links-label {
      font-weight: 600;
    }
    .method-links a {
      color: var(--mat-sys-primary);
    }
  `,
})
export class MethodLinks {
  readonly kind = input.required<string>();
  /** The output on show: the newest one when it succeeded, else the last good one kept below a failure. */
  readonly output = input<CellOutput | null>(null);

  private readonly catalogue = inject(METHOD_CATALOGUE);
  /** Ids not in the catalogue (a kind whose methods have no page yet) are left out, never shown as dead links. */
  protected readonly methods = computed(() => {
    const output = this.output();
    const ids = output?.status === 'ok' ? resultMethodIds(this.kind(), output.result) : [];
    return ids.filter(isMethodId).map((id) => ({ id, name: METHOD_NAMES[id] }));
  });
  /** Each method's purpose, once the catalogue has come. */
  protected readonly purposes = computed(() => {
    const catalogue = this.catalogue.module();
    const output = this.output();
    return catalogue && output && this.methods().length > 0 ? new Map(catalogue.resultMethods(this.kind(), output.result).map((m) => [m.id, m.purpose])) : null;
  });

  constructor() {
    if (!this.catalogue.module()) inject(PendingTasks).run(this.catalogue.loadWhenIdle);
  }
}
