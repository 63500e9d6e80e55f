import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, type Type, computed, input, resource } from '@angular/core';
import type { DraftCell } from '@laminote/contracts';
import { CELL_BODIES, type CellBodyComponent } from './cell-bodies';

/**
 * A cell's body: its kind's component (`CELL_BODIES`), loaded on first use and given the cell. Until
 * the component's code is here, or while the page holds the body back (`held`: cells below the first
 * screen are drawn in small batches), it says it is drawing; a failed load is said.
 */
@Component({
  selector: 'lam-cell-body',
  imports: [NgComponentOutlet],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (body.value(); as component) {
      <ng-container *ngComponentOutlet="component; inputs: inputs()" />
    } @else if (body.error()) {
      <p class="body-pending" role="alert">This cell could not be drawn: its code did not load. Reload the page to try again.</p>
    } @else {
      <p class="body-pending" aria-busy="true">Drawing…</p>
    }
  `,
  styles: `
    .body-pending {
      min-height: 6rem;
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class CellBody {
  readonly cell = input.required<DraftCell>();
  /** Not drawn yet: the page draws the cells below the first screen a few at a time. */
  readonly held = input(false);

  private readonly kind = computed(() => this.cell().kind);
  protected readonly body = resource<Type<CellBodyComponent>, DraftCell['kind'] | undefined>({
    params: () => (this.held() ? undefined : this.kind()),
    loader: ({ params }) => CELL_BODIES[params](),
  });
  protected readonly inputs = computed(() => ({ cell: this.cell() }));
}
