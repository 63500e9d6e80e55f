import { ReadablePipe } from '../../shared/readable';
import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { parseSectionCoordinates } from '@laminote/aero/section-coordinates';
import type { DraftCell, SectionResult } from '@laminote/contracts';
import { Plot } from '../../shared/plot';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { DraftSession } from '../../shared/draft-session';
import { cpFigure, outlineFigure } from './section-figures';

interface SectionFormValue {
  source: 'naca' | 'coordinates';
  naca: string;
  coordinates: string;
  flowCellId: string;
  at: 'alpha' | 'cl';
  alphaDeg: string;
  cl: string;
  panels: string;
}

/** No flow cell: the section is solved incompressible. */
const INCOMPRESSIBLE = '';

/**
 * Section: a NACA designation or pasted coordinates, its outline and geometry, and its Cp from the
 * engine's panel method at an incidence or a lift coefficient (Kármán–Tsien at the flow cell's Mach).
 */
@Component({
  selector: 'lam-section-cell',
  imports: [ReadablePipe, CellResult, DecimalPipe, MatButtonToggleModule, MatFormFieldModule, MatInputModule, MatSelectModule, Plot, ReactiveFormsModule],
  templateUrl: './section-cell.html',
  styleUrls: ['../simple-cell.scss', '../shape-cell.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SectionCell {
  private readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly incompressible = INCOMPRESSIBLE;
  protected readonly form = new FormGroup({
    source: new FormControl<'naca' | 'coordinates'>('naca', { nonNullable: true }),
    naca: new FormControl('', { nonNullable: true }),
    coordinates: new FormControl('', { nonNullable: true }),
    flowCellId: new FormControl(INCOMPRESSIBLE, { nonNullable: true }),
    at: new FormControl<'alpha' | 'cl'>('alpha', { nonNullable: true }),
    alphaDeg: new FormControl('', { nonNullable: true }),
    cl: new FormControl('', { nonNullable: true }),
    panels: new FormControl('', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<SectionFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => ({
      source: inputs['source'] === 'coordinates' ? 'coordinates' : 'naca',
      naca: typeof inputs['naca'] === 'string' ? inputs['naca'] : '',
      coordinates: typeof inputs['coordinates'] === 'string' ? inputs['coordinates'] : '',
      flowCellId: typeof inputs['flowCellId'] === 'string' ? inputs['flowCellId'] : INCOMPRESSIBLE,
      at: inputs['at'] === 'cl' ? 'cl' : 'alpha',
      alphaDeg: numberText(inputs['alphaDeg']),
      cl: numberText(inputs['cl']),
      panels: numberText(inputs['panels']),
    }),
    fromForm: (value, previous) => {
      const inputs: Record<string, unknown> = {
        ...previous,
        source: value.source,
        naca: value.naca,
        coordinates: value.coordinates,
        flowCellId: value.flowCellId === INCOMPRESSIBLE ? null : value.flowCellId,
        at: value.at,
        alphaDeg: numberInput(value.alphaDeg),
        cl: numberInput(value.cl),
        panels: numberInput(value.panels),
      };
      for (const key of Object.keys(inputs)) if (inputs[key] === undefined) delete inputs[key];
      return inputs;
    },
  });

  protected readonly flowCells = computed(() => this.session.cells().filter((c) => c.kind === 'flow'));
  protected readonly source = computed(() => (this.cell().inputs['source'] === 'coordinates' ? 'coordinates' : 'naca'));
  protected readonly at = computed(() => (this.cell().inputs['at'] === 'cl' ? 'cl' : 'alpha'));

  /** Pasted coordinates read as they are typed: the first problem by its line, or the point count. */
  protected readonly coordinatesCheck = computed((): { ok: boolean; text: string } | null => {
    if (this.source() !== 'coordinates') return null;
    const text = this.cell().inputs['coordinates'];
    if (typeof text !== 'string' || text.trim() === '') return null;
    const parsed = parseSectionCoordinates(text);
    if (!parsed.ok) return { ok: false, text: `Line ${parsed.problems[0]!.line}: ${parsed.problems[0]!.message}` };
    return { ok: true, text: `${parsed.x.length} points read as ${parsed.layout === 'loop' ? 'a closed loop' : 'two surfaces'}${parsed.title ? ` · “${parsed.title}”` : ''}` };
  });

  protected readonly result = computed(() => {
    const shown = shownResult(this.cell());
    return shown ? (shown.output.result as SectionResult) : null;
  });
  protected readonly outline = computed(() => {
    const r = this.result();
    return r ? outlineFigure(r.outline) : null;
  });
  protected readonly cp = computed(() => {
    const r = this.result();
    return r ? cpFigure(r) : null;
  });

  protected cellTitle(cell: DraftCell): string {
    return cell.title.trim() || 'Untitled';
  }

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }
}
