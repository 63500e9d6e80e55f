import type { InputSignal, Type } from '@angular/core';
import type { DraftCell } from '@laminote/contracts';
import type { CellKind } from '@laminote/contracts/cell-kinds';
import { AnalysisCell } from './analysis/analysis-cell';
import { FlatPlateCell } from './flat-plate/flat-plate-cell';
import { FlowCell } from './flow/flow-cell';
import { NoteCell } from './note/note-cell';
import { PressureCell } from './pressure/pressure-cell';

/** What every cell body is: a component whose one input is the cell. */
export interface CellBodyComponent {
  readonly cell: InputSignal<DraftCell>;
}

/** A body fetched when a cell of its kind is first drawn, apart from the notebook's own code. */
export interface LoadedBody {
  readonly load: () => Promise<Type<CellBodyComponent>>;
}

/**
 * The body component of each cell kind (its folder's `*-cell.ts`). Every body takes the cell as its one
 * input, `cell`. The type asks for every kind of the registry (libs/contracts `CELL_KINDS`), so a new
 * kind does not build until its body is named here.
 *
 * The kinds nearly every study has come with the notebook's code and are drawn in the frame's own pass:
 * the flow, the pressure distribution, the analysis, the flat plate and the note. The others (shapes,
 * polar, sweep, comparison, leading edge) are fetched on first use (`LoadedBody`), so a first screen does
 * not carry their code, nor the panel methods, tabs and fields only they use; a study that has them asks
 * for their code as soon as its draft is read (early-reads.js, and `fetchBodiesOf` here).
 */
export const CELL_BODIES: { readonly [K in CellKind]: Type<CellBodyComponent> | LoadedBody } = {
  flow: FlowCell,
  pressure: PressureCell,
  section: { load: () => import('./section/section-cell').then((m) => m.SectionCell) },
  body: { load: () => import('./body/body-cell').then((m) => m.BodyCell) },
  analysis: AnalysisCell,
  polar: { load: () => import('./polar/polar-cell').then((m) => m.PolarCell) },
  sweep: { load: () => import('./sweep/sweep-cell').then((m) => m.SweepCell) },
  comparison: { load: () => import('./comparison/comparison-cell').then((m) => m.ComparisonCell) },
  flatPlate: FlatPlateCell,
  leadingEdge: { load: () => import('./leading-edge/leading-edge-cell').then((m) => m.LeadingEdgeCell) },
  note: NoteCell,
};

/**
 * Starts fetching the code of the kinds among `kinds` that does not come with the page, so a study's
 * polar or sweep is not drawn a round trip after its frame. A failed fetch is tried again when drawn.
 */
export function fetchBodiesOf(kinds: Iterable<CellKind>): void {
  for (const kind of new Set(kinds)) {
    const entry = CELL_BODIES[kind];
    if ('load' in entry) void entry.load().catch(() => undefined);
  }
}
