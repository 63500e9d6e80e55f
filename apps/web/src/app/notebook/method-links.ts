import { ChangeDetectionStrategy, Component, PendingTasks, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import type { CellOutput } from '@laminote/contracts';
import { lazyModule } from '../shared/lazy-module';

/** The methods catalogue (every method's formula and sources), fetched once, after the first screen. */
const catalogue = lazyModule(() => import('@laminote/aero/methods/result-methods'));

/**
 * The "Methods" line under a cell's result: one link per method its numbers come from, to the page with
 * the formula, symbols, validity, sources and limits — so every number on the screen can be traced.
 * The same list the report prints per cell (`resultMethods` in libs/aero). The catalogue loads apart
 * from the first screen, so the line appears a moment after the result.
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
          <a [routerLink]="['/methods', method.id]" [attr.title]="method.purpose">{{ method.name }}</a>
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

  protected readonly methods = computed(() => {
    const output = this.output();
    const methods = catalogue.module();
    return methods && output && output.status === 'ok' ? methods.resultMethods(this.kind(), output.result) : [];
  });

  constructor() {
    if (!catalogue.module()) inject(PendingTasks).run(catalogue.loadWhenIdle);
  }
}
