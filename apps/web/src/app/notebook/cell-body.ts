import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, type Type, computed, input, resource } from '@angular/core';
import type { DraftCell } from '@laminote/contracts';
import { CELL_BODIES, type CellBodyComponent, type LoadedBody } from './cell-bodies';

/**
 * A cell's body: its kind's component (`CELL_BODIES`), given the cell. While the kind's code is still
 * being fetched it says it is drawing; a fetch that failed is said. The page makes it once the body is
 * to be drawn (cells below the first screen are drawn while the browser is idle); until then the page
 * shows the same placeholder, `bodyPlaceholderHeight` tall.
 */
@Component({
  selector: 'lam-cell-body',
  imports: [NgComponentOutlet],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (body(); as component) {
      <ng-container *ngComponentOutlet="component; inputs: inputs()" />
    } @else if (loaded.error()) {
      <p class="body-pending" role="alert">This cell could not be drawn: its code did not load. Reload the page to try again.</p>
    } @else {
      <p class="body-pending" aria-busy="true" [style.min-height.px]="placeholderHeight()">Drawing…</p>
    }
  `,
})
export class CellBody {
  readonly cell = input.required<DraftCell>();

  private readonly kind = computed(() => this.cell().kind);
  private readonly entry = computed(() => CELL_BODIES[this.kind()]);
  /** The code of a kind fetched on first use, once the body is to be drawn. */
  protected readonly loaded = resource<Type<CellBodyComponent>, LoadedBody | undefined>({
    params: () => {
      const entry = this.entry();
      return 'load' in entry ? entry : undefined;
    },
    loader: ({ params }) => params.load(),
  });
  protected readonly body = computed((): Type<CellBodyComponent> | null => {
    const entry = this.entry();
    // A resource in its error state throws when its value is read: the template says the error instead.
    if ('load' in entry) return this.loaded.hasValue() ? this.loaded.value() : null;
    return entry;
  });
  protected readonly inputs = computed(() => ({ cell: this.cell() }));
  protected readonly placeholderHeight = computed(() => bodyPlaceholderHeight(this.cell()));
}

/** About the drawn body's height, so the page does not jump as the bodies come and the first screen is measured right. */
export function bodyPlaceholderHeight(cell: DraftCell): number {
  const [withResult, withoutResult] = BODY_HEIGHTS[cell.kind];
  return cell.output || cell.lastGoodOutput ? withResult : withoutResult;
}

/**
 * Each kind's drawn body, in CSS pixels inside the frame's padding, with a result and without (measured in
 * a 1280-pixel-wide window on the demo studies; a narrower window wraps more, so a drawn body may be taller).
 */
const BODY_HEIGHTS: { readonly [K in DraftCell['kind']]: readonly [number, number] } = {
  flow: [485, 375],
  pressure: [980, 615],
  section: [980, 615],
  body: [385, 375],
  analysis: [1180, 235],
  polar: [880, 280],
  sweep: [880, 185],
  comparison: [580, 280],
  flatPlate: [655, 375],
  leadingEdge: [275, 275],
  note: [90, 90],
};
