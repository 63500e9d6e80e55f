import { ReadablePipe } from '../../shared/readable';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MACK_TURBULENCE_RANGE, mackCriticalN } from '@laminote/aero/envelope-en';
import { type FlowCondition, deriveFlowCondition } from '@laminote/aero/flow-condition';
import type { DraftCell, FlowResult } from '@laminote/contracts';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { fixed, sci } from '../../shared/format';

type FlowMode = 'altitude' | 'reynolds';
type TurbulenceMode = 'intensity' | 'nCrit';

interface FlowFormValue {
  mode: FlowMode;
  altitude_m: string;
  isaTemperatureOffset_K: string;
  mach: string;
  referenceLength_m: string;
  reynolds: string;
  turbulenceMode: TurbulenceMode;
  turbulencePercent: string;
  nCrit: string;
  sweepDeg: string;
}

/** One derived quantity as the cell shows it. */
interface Derived {
  readonly symbol: string;
  readonly name: string;
  readonly value: string;
  readonly unit: string;
}

function toNumber(value: unknown): number | undefined {
  return typeof value === 'number' && Number.isFinite(value) ? value : undefined;
}

/**
 * Flow condition: the free stream the analyses below use. As the person types, the derived Reynolds
 * number, viscosity, speed and dynamic pressure (ISA, Sutherland) and the N_crit implied by a
 * turbulence level are worked out here with the engine's own functions.
 */
@Component({
  selector: 'lam-flow-cell',
  imports: [ReadablePipe, CellResult, MatButtonToggleModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  templateUrl: './flow-cell.html',
  styleUrls: ['../simple-cell.scss', './flow-cell.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FlowCell {
  readonly cell = input.required<DraftCell>();

  protected readonly form = new FormGroup({
    mode: new FormControl<FlowMode>('altitude', { nonNullable: true }),
    altitude_m: new FormControl('', { nonNullable: true }),
    isaTemperatureOffset_K: new FormControl('', { nonNullable: true }),
    mach: new FormControl('', { nonNullable: true }),
    referenceLength_m: new FormControl('', { nonNullable: true }),
    reynolds: new FormControl('', { nonNullable: true }),
    turbulenceMode: new FormControl<TurbulenceMode>('nCrit', { nonNullable: true }),
    turbulencePercent: new FormControl('', { nonNullable: true }),
    nCrit: new FormControl('', { nonNullable: true }),
    sweepDeg: new FormControl('', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<FlowFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => ({
      mode: inputs['mode'] === 'reynolds' ? 'reynolds' : 'altitude',
      altitude_m: numberText(inputs['altitude_m']),
      isaTemperatureOffset_K: numberText(inputs['isaTemperatureOffset_K']),
      mach: numberText(inputs['mach']),
      referenceLength_m: numberText(inputs['referenceLength_m']),
      reynolds: numberText(inputs['reynolds']),
      turbulenceMode: inputs['turbulenceMode'] === 'intensity' ? 'intensity' : 'nCrit',
      turbulencePercent:
        typeof inputs['turbulenceIntensity'] === 'number' ? numberText(inputs['turbulenceIntensity'] * 100) : numberText(inputs['turbulenceIntensity']),
      nCrit: numberText(inputs['nCrit']),
      sweepDeg: numberText(inputs['sweepDeg']),
    }),
    fromForm: (value, previous) => {
      const percent = numberInput(value.turbulencePercent);
      const inputs: Record<string, unknown> = {
        ...previous,
        mode: value.mode,
        altitude_m: numberInput(value.altitude_m),
        isaTemperatureOffset_K: numberInput(value.isaTemperatureOffset_K),
        mach: numberInput(value.mach),
        referenceLength_m: numberInput(value.referenceLength_m),
        reynolds: numberInput(value.reynolds),
        turbulenceMode: value.turbulenceMode,
        turbulenceIntensity: typeof percent === 'number' ? Number((percent / 100).toPrecision(12)) : percent,
        nCrit: numberInput(value.nCrit),
        sweepDeg: numberInput(value.sweepDeg),
      };
      for (const key of Object.keys(inputs)) if (inputs[key] === undefined) delete inputs[key];
      return inputs;
    },
    controlOf: (field) => (field === 'turbulenceIntensity' ? 'turbulencePercent' : field.split('.')[0]),
  });

  protected readonly inputs = computed(() => this.cell().inputs);
  protected readonly mode = computed(() => (this.inputs()['mode'] === 'reynolds' ? 'reynolds' : 'altitude'));
  protected readonly turbulenceMode = computed(() => (this.inputs()['turbulenceMode'] === 'intensity' ? 'intensity' : 'nCrit'));

  /** The free stream as typed so far, or why it cannot be worked out yet. */
  protected readonly derivation = computed((): { condition: FlowCondition } | { problem: string } => {
    const inputs = this.inputs();
    try {
      const condition =
        this.mode() === 'reynolds'
          ? deriveFlowCondition({ reynolds: toNumber(inputs['reynolds']) ?? Number.NaN, mach: toNumber(inputs['mach']) ?? 0 })
          : deriveFlowCondition({
              altitude_m: toNumber(inputs['altitude_m']),
              isaTemperatureOffset_K: toNumber(inputs['isaTemperatureOffset_K']) ?? 0,
              mach: toNumber(inputs['mach']) ?? Number.NaN,
              referenceLength_m: toNumber(inputs['referenceLength_m']),
            });
      return { condition };
    } catch (error) {
      return { problem: error instanceof Error ? error.message : String(error) };
    }
  });

  protected readonly derived = computed((): Derived[] => {
    const result = this.derivation();
    if (!('condition' in result)) return [];
    const c = result.condition;
    const rows: Derived[] = [{ symbol: 'Re', name: 'Reynolds number on L', value: sci(c.reynolds), unit: '' }];
    if (c.speed_ms !== undefined) {
      rows.push(
        { symbol: 'ν∞', name: 'kinematic viscosity', value: sci(c.kinematicViscosity_m2s), unit: 'm²/s' },
        { symbol: 'V∞', name: 'true airspeed', value: fixed(c.speed_ms, 1), unit: 'm/s' },
        { symbol: 'q∞', name: 'dynamic pressure', value: fixed((c.dynamicPressure_Pa ?? Number.NaN) / 1000, 2), unit: 'kPa' },
        { symbol: 'Re/m', name: 'unit Reynolds number', value: sci(c.reynoldsPerMetre), unit: '1/m' },
        { symbol: 'T∞', name: 'static temperature', value: fixed(c.temperature_K, 2), unit: 'K' },
        { symbol: 'ρ∞', name: 'density', value: fixed(c.density_kgm3, 4), unit: 'kg/m³' },
      );
    }
    return rows;
  });

  /** N_crit from Mack's relation for the turbulence level, with a note outside its range. */
  protected readonly impliedNCrit = computed((): { value: string; note: string | null } | null => {
    if (this.turbulenceMode() !== 'intensity') return null;
    const tu = toNumber(this.inputs()['turbulenceIntensity']);
    if (tu === undefined || !(tu > 0)) return null;
    const [low, high] = MACK_TURBULENCE_RANGE;
    const note =
      tu < low || tu > high
        ? `Outside ${percent(low)} % to ${percent(high)} %, the turbulence levels Mack’s relation is quoted for (N_crit 9 down to 0): the value is extrapolated.`
        : null;
    return { value: fixed(mackCriticalN(tu), 2), note };
  });

  protected readonly result = computed(() => {
    const shown = shownResult(this.cell());
    return shown ? (shown.output.result as FlowResult) : null;
  });

  protected problem(control: string): string {
    const message = this.binding.problems().get(control === 'turbulencePercent' ? 'turbulenceIntensity' : control) ?? '';
    if (control === 'turbulencePercent' && /fraction/.test(message)) return 'At most 5 %';
    return message;
  }
}

/** A fraction as a percentage, without the binary fraction's trailing digits (0.0007 → 0.07). */
function percent(fraction: number): string {
  return String(Number((fraction * 100).toPrecision(6)));
}
