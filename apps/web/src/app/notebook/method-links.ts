import { ChangeDetectionStrategy, Component, InjectionToken, PendingTasks, computed, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import { resultMethodIds } from '@laminote/aero/methods/result-method-ids';
import type { CellOutput } from '@laminote/contracts';
import { type LazyModule, lazyModule } from '../shared/lazy-module';

type Catalogue = typeof import('@laminote/aero/methods/result-methods');

/** The methods catalogue (every method's formula and sources), fetched once, after the first screen. */
export const METHOD_CATALOGUE = new InjectionToken<LazyModule<Catalogue>>('methods catalogue', {
  providedIn: 'root',
  factory: () => lazyModule(() => import('@laminote/aero/methods/result-methods')),
});

/**
 * The "Methods" line under a cell's result: one link per method its numbers come from, to the page with
 * the formula, symbols, validity, sources and limits — so every number on the screen can be traced.
 * The same list the report prints per cell (`resultMethods` in libs/aero). The catalogue loads apart
 * from the first screen, so the links appear a moment after the result; until then the line's place is
 * kept (which methods a result has is known without the catalogue), so nothing below it moves when
 * they come, and the first screen is measured as it will stay.
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
    } @else if (keepPlace()) {
      <p class="method-links method-links-coming" aria-hidden="true"><span class="method-links-label">Methods</span></p>
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
    .method-links-coming {
      visibility: hidden;
    }
  `,
})
export class MethodLinks {
  readonly kind = input.required<string>();
  /** The output on show: the newest one when it succeeded, else the last good one kept below a failure. */
  readonly output = input<CellOutput | null>(null);

  private readonly catalogue = inject(METHOD_CATALOGUE);
  private readonly ids = computed(() => {
    const output = this.output();
    return output?.status === 'ok' ? resultMethodIds(this.kind(), output.result) : [];
  });
  protected readonly methods = computed(() => {
    const output = this.output();
    const catalogue = this.catalogue.module();
    return catalogue && output && this.ids().length > 0 ? catalogue.resultMethods(this.kind(), output.result) : [];
  });
  /** The catalogue is still coming and the result has methods: their line's place is kept, empty. */
  protected readonly keepPlace = computed(() => !this.catalogue.module() && this.ids().length > 0);

  constructor() {
    if (!this.catalogue.module()) inject(PendingTasks).run(this.catalogue.loadWhenIdle);
  }
}
