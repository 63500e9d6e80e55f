import { ReadablePipe } from '../../shared/readable';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { flatPlateEstimate } from '@laminote/aero/flat-plate';
import type { DraftCell, FlatPlateResult } from '@laminote/contracts';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { sci } from '../../shared/format';

type Mode = 'reynolds' | 'dimensional';
type TransitionMode = 'reynolds' | 'location';

interface FlatPlateFormValue {
  mode: Mode;
  reynolds: string;
  length_m: string;
  speed_mps: string;
  kinematicViscosity_m2s: string;
  transitionMode: TransitionMode;
  transitionReynolds: string;
  transitionLocation: string;
}

interface Row {
  readonly quantity: string;
  readonly symbol: string;
  readonly value: string;
}

const NUMBER_FIELDS = ['reynolds', 'length_m', 'speed_mps', 'kinematicViscosity_m2s', 'transitionReynolds', 'transitionLocation'] as const;

function num(value: unknown): number | undefined {
  return typeof value === 'number' && Number.isFinite(value) ? value : undefined;
}

/**
 * Flat-plate estimate: laminar, turbulent and mixed skin friction of a plate, for quick sizing of
 * nacelles and fairings. Worked out here as the person types with the engine's functions; the run
 * stores it with the study.
 */
@Component({
  selector: 'lam-flat-plate-cell',
  imports: [ReadablePipe, CellResult, MatButtonToggleModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './flat-plate-cell.html',
  styleUrl: '../simple-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FlatPlateCell {
  readonly cell = input.required<DraftCell>();

  protected readonly form = new FormGroup({
    mode: new FormControl<Mode>('reynolds', { nonNullable: true }),
    reynolds: new FormControl('', { nonNullable: true }),
    length_m: new FormControl('', { nonNullable: true }),
    speed_mps: new FormControl('', { nonNullable: true }),
    kinematicViscosity_m2s: new FormControl('', { nonNullable: true }),
    transitionMode: new FormControl<TransitionMode>('reynolds', { nonNullable: true }),
    transitionReynolds: new FormControl('', { nonNullable: true }),
    transitionLocation: new FormControl('', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<FlatPlateFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => {
      const value = {
        mode: inputs['mode'] === 'dimensional' ? 'dimensional' : 'reynolds',
        transitionMode: inputs['transitionMode'] === 'location' ? 'location' : 'reynolds',
      } as FlatPlateFormValue;
      for (const field of NUMBER_FIELDS) value[field] = numberText(inputs[field]);
      return value;
    },
    fromForm: (value, previous) => {
      const inputs: Record<string, unknown> = { ...previous, mode: value.mode, transitionMode: value.transitionMode };
      for (const field of NUMBER_FIELDS) {
        const parsed = numberInput(value[field]);
        if (parsed === undefined) delete inputs[field];
        else inputs[field] = parsed;
      }
      return inputs;
    },
  });

  protected readonly mode = computed(() => (this.cell().inputs['mode'] === 'dimensional' ? 'dimensional' : 'reynolds'));
  protected readonly transitionMode = computed(() => (this.cell().inputs['transitionMode'] === 'location' ? 'location' : 'reynolds'));

  /** Re_L and the transition fraction as typed, or null while something is missing. */
  private readonly plate = computed(() => {
    const inputs = this.cell().inputs;
    const length = num(inputs['length_m']);
    const reynolds =
      this.mode() === 'reynolds'
        ? num(inputs['reynolds'])
        : length !== undefined && num(inputs['speed_mps']) !== undefined && num(inputs['kinematicViscosity_m2s'])
          ? (num(inputs['speed_mps'])! * length) / num(inputs['kinematicViscosity_m2s'])!
          : undefined;
    if (reynolds === undefined || !(reynolds > 0)) return null;
    const fraction = this.transitionMode() === 'location' ? num(inputs['transitionLocation']) : (num(inputs['transitionReynolds']) ?? Number.NaN) / reynolds;
    if (fraction === undefined || !(fraction >= 0)) return null;
    return { reynolds, fraction: Math.min(fraction, 1), length: this.mode() === 'dimensional' ? length : undefined, capped: fraction > 1 };
  });

  protected readonly stored = computed(() => {
    const shown = shownResult(this.cell());
    return shown && this.cell().runState === 'current' ? (shown.output.result as FlatPlateResult) : null;
  });

  protected readonly rows = computed((): Row[] | null => {
    const stored = this.stored();
    const plate = this.plate();
    let e: Omit<FlatPlateResult, 'warnings' | 'transitionLocation' | 'deltaLaminar_m' | 'deltaTurbulent_m'> & {
      deltaLaminar_m: number | null;
      deltaTurbulent_m: number | null;
      transitionLocation: number;
    };
    if (stored) e = stored;
    else if (plate) {
      try {
        const estimate = flatPlateEstimate(plate.reynolds, plate.fraction);
        e = {
          ...estimate,
          transitionLocation: plate.fraction,
          deltaLaminar_m: plate.length !== undefined ? estimate.deltaLaminar * plate.length : null,
          deltaTurbulent_m: plate.length !== undefined ? estimate.deltaTurbulent * plate.length : null,
        };
      } catch {
        return null;
      }
    } else return null;
    const rows: Row[] = [
      { quantity: 'Plate Reynolds number', symbol: 'Re_L', value: sci(e.reynolds) },
      { quantity: 'Transition', symbol: 'x_tr/L · Re_x,tr', value: `${e.transitionLocation.toFixed(3)} · ${sci(e.transitionReynolds)}` },
      { quantity: 'Mean skin friction, all laminar (Blasius)', symbol: 'C_F,lam', value: e.cfLaminar.toExponential(4) },
      { quantity: 'Mean skin friction, all turbulent (Schlichting)', symbol: 'C_F,turb', value: e.cfTurbulent.toExponential(4) },
      { quantity: 'Mean skin friction, all turbulent (Prandtl, 1/5 power)', symbol: 'C_F,turb', value: e.cfTurbulentPrandtl.toExponential(4) },
      { quantity: 'Mean skin friction, mixed flow', symbol: 'C_F,mixed', value: e.cfMixed.toExponential(4) },
      { quantity: 'Friction saved by the laminar run', symbol: '1 − C_F,mixed/C_F,turb', value: `${(e.laminarSaving * 100).toFixed(1)} %` },
      {
        quantity: 'Boundary-layer thickness at the end, laminar',
        symbol: 'δ/L',
        value: e.deltaLaminar.toExponential(3) + (e.deltaLaminar_m !== null ? ` (${(e.deltaLaminar_m * 1000).toFixed(2)} mm)` : ''),
      },
      {
        quantity: 'Boundary-layer thickness at the end, turbulent',
        symbol: 'δ/L',
        value: e.deltaTurbulent.toExponential(3) + (e.deltaTurbulent_m !== null ? ` (${(e.deltaTurbulent_m * 1000).toFixed(2)} mm)` : ''),
      },
    ];
    return rows;
  });

  protected readonly capped = computed(() => this.plate()?.capped ?? false);
  protected readonly warnings = computed(() => this.stored()?.warnings ?? []);

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }
}
