import { ReadablePipe } from '../../shared/readable';
import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { readBodyMeridian, ShapeInputError } from '@laminote/aero/shape-input';
import type { BodyResult, DraftCell } from '@laminote/contracts';
import { Plot } from '../../shared/plot';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { bodyCpFigure, bodyOutlineFigure } from './body-figures';

interface BodyFormValue {
  source: 'spheroid' | 'coordinates';
  fineness: string;
  coordinates: string;
  panels: string;
}

/**
 * Body of revolution: a prolate spheroid of a fineness ratio, or a pasted meridian from the nose to the
 * tail; its outline and its Cp from the engine's axisymmetric panel method at zero incidence. An analysis
 * may name it in place of a pressure cell (one surface with its radius: Mangler's transformation).
 */
@Component({
  selector: 'lam-body-cell',
  imports: [ReadablePipe, CellResult, DecimalPipe, MatButtonToggleModule, MatFormFieldModule, MatInputModule, Plot, ReactiveFormsModule],
  templateUrl: './body-cell.html',
  styleUrls: ['../simple-cell.scss', '../shape-cell.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BodyCell {
  readonly cell = input.required<DraftCell>();

  protected readonly form = new FormGroup({
    source: new FormControl<'spheroid' | 'coordinates'>('spheroid', { nonNullable: true }),
    fineness: new FormControl('', { nonNullable: true }),
    coordinates: new FormControl('', { nonNullable: true }),
    panels: new FormControl('', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<BodyFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => ({
      source: inputs['source'] === 'coordinates' ? 'coordinates' : 'spheroid',
      fineness: numberText(inputs['fineness']),
      coordinates: typeof inputs['coordinates'] === 'string' ? inputs['coordinates'] : '',
      panels: numberText(inputs['panels']),
    }),
    fromForm: (value, previous) => {
      const inputs: Record<string, unknown> = {
        ...previous,
        source: value.source,
        fineness: numberInput(value.fineness),
        coordinates: value.coordinates,
        panels: numberInput(value.panels),
      };
      for (const key of Object.keys(inputs)) if (inputs[key] === undefined) delete inputs[key];
      return inputs;
    },
  });

  protected readonly source = computed(() => (this.cell().inputs['source'] === 'coordinates' ? 'coordinates' : 'spheroid'));

  /** The pasted meridian read as it is typed, by the engine's own reader: the first problem by its line, or the point count. */
  protected readonly coordinatesCheck = computed((): { ok: boolean; text: string } | null => {
    if (this.source() !== 'coordinates') return null;
    const text = this.cell().inputs['coordinates'];
    if (typeof text !== 'string' || text.trim() === '') return null;
    try {
      return { ok: true, text: `${readBodyMeridian(text).x.length} points read from the nose to the tail` };
    } catch (error) {
      if (!(error instanceof ShapeInputError)) throw error;
      const message = error.message.replace(/^line \d+: /, '');
      return { ok: false, text: error.line ? `Line ${error.line}: ${message}` : message.charAt(0).toUpperCase() + message.slice(1) };
    }
  });

  protected readonly result = computed(() => {
    const shown = shownResult(this.cell());
    return shown ? (shown.output.result as BodyResult) : null;
  });
  protected readonly outline = computed(() => {
    const r = this.result();
    return r ? bodyOutlineFigure(r.outline) : null;
  });
  protected readonly cp = computed(() => {
    const r = this.result();
    return r ? bodyCpFigure(r) : null;
  });

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }
}
