import type { InputSignal, Type } from '@angular/core';
import type { DraftCell } from '@laminote/contracts';
import type { CellKind } from '@laminote/contracts/cell-kinds';

/** What every cell body is: a component whose one input is the cell. */
export interface CellBodyComponent {
  readonly cell: InputSignal<DraftCell>;
}

/**
 * The body component of each cell kind (its folder's `*-cell.ts`), loaded when a cell of that kind is
 * first drawn. Every body takes the cell as its one input, `cell`. The type asks for every kind of the
 * registry (libs/contracts `CELL_KINDS`), so a new kind does not build until its body is named here.
 */
export const CELL_BODIES: { readonly [K in CellKind]: () => Promise<Type<CellBodyComponent>> } = {
  flow: () => import('./flow/flow-cell').then((m) => m.FlowCell),
  pressure: () => import('./pressure/pressure-cell').then((m) => m.PressureCell),
  section: () => import('./section/section-cell').then((m) => m.SectionCell),
  body: () => import('./body/body-cell').then((m) => m.BodyCell),
  analysis: () => import('./analysis/analysis-cell').then((m) => m.AnalysisCell),
  polar: () => import('./polar/polar-cell').then((m) => m.PolarCell),
  sweep: () => import('./sweep/sweep-cell').then((m) => m.SweepCell),
  comparison: () => import('./comparison/comparison-cell').then((m) => m.ComparisonCell),
  flatPlate: () => import('./flat-plate/flat-plate-cell').then((m) => m.FlatPlateCell),
  leadingEdge: () => import('./leading-edge/leading-edge-cell').then((m) => m.LeadingEdgeCell),
  note: () => import('./note/note-cell').then((m) => m.NoteCell),
};
