import type { InputSignal, Type } from '@angular/core';
import type { DraftCell } from '@laminote/contracts';
import type { CellKind } from '@laminote/contracts/cell-kinds';
import { AnalysisCell } from './analysis/analysis-cell';
import { BodyCell } from './body/body-cell';
import { ComparisonCell } from './comparison/comparison-cell';
import { FlatPlateCell } from './flat-plate/flat-plate-cell';
import { FlowCell } from './flow/flow-cell';
import { LeadingEdgeCell } from './leading-edge/leading-edge-cell';
import { NoteCell } from './note/note-cell';
import { PolarCell } from './polar/polar-cell';
import { PressureCell } from './pressure/pressure-cell';
import { SectionCell } from './section/section-cell';
import { SweepCell } from './sweep/sweep-cell';

/** What every cell body is: a component whose one input is the cell. */
export interface CellBodyComponent {
  readonly cell: InputSignal<DraftCell>;
}

/**
 * The body component of each cell kind (its folder's `*-cell.ts`). Every body takes the cell as its one
 * input, `cell`. The type asks for every kind of the registry (libs/contracts `CELL_KINDS`), so a new
 * kind does not build until its body is named here.
 */
export const CELL_BODIES: { readonly [K in CellKind]: Type<CellBodyComponent> } = {
  flow: FlowCell,
  pressure: PressureCell,
  section: SectionCell,
  body: BodyCell,
  analysis: AnalysisCell,
  polar: PolarCell,
  sweep: SweepCell,
  comparison: ComparisonCell,
  flatPlate: FlatPlateCell,
  leadingEdge: LeadingEdgeCell,
  note: NoteCell,
};
