import { ReadablePipe } from '../../shared/readable';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ENGINE_CAUTION } from '@laminote/aero';
import { type DraftCell, SWEEP_RANGES, type SweepInputs, type SweepResult } from '@laminote/contracts';
import { PLOT_COLOURS, Plot, type PlotFigure, type PlotTrace } from '../../shared/plot';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { DraftSession } from '../../shared/draft-session';
import { CAUSE_LABELS } from '../../shared/analysis-summary';
import { rangeText, sci } from '../../shared/format';
import { PARAMETER_LABELS } from '../../shared/sweep-parameters';

type Parameter = SweepInputs['parameter'];

interface SweepFormValue {
  analysisCellId: string;
  parameter: Parameter;
  from: string;
  to: string;
  steps: string;
}


/** Parameter sweep: one analysis re-run over a range of one parameter, to see whether the laminar run survives off-design. */
@Component({
  selector: 'lam-sweep-cell',
  imports: [ReadablePipe, CellResult, MatFormFieldModule, MatInputModule, MatSelectModule, Plot, ReactiveFormsModule],
  templateUrl: './sweep-cell.html',
  styleUrl: '../simple-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SweepCell {
  private readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly parameters = Object.keys(PARAMETER_LABELS) as Parameter[];
  protected readonly labels = PARAMETER_LABELS;
  protected readonly ranges = SWEEP_RANGES;
  protected readonly caution = ENGINE_CAUTION;
  protected readonly rangeText = rangeText;

  protected readonly form = new FormGroup({
    analysisCellId: new FormControl('', { nonNullable: true }),
    parameter: new FormControl<Parameter>('nCrit', { nonNullable: true }),
    from: new FormControl('', { nonNullable: true }),
    to: new FormControl('', { nonNullable: true }),
    steps: new FormControl('', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<SweepFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => ({
      analysisCellId: String(inputs['analysisCellId'] ?? ''),
      parameter: (inputs['parameter'] as Parameter) ?? 'nCrit',
      from: numberText(inputs['from']),
      to: numberText(inputs['to']),
      steps: numberText(inputs['steps']),
    }),
    fromForm: (value, previous) => {
      const inputs: Record<string, unknown> = {
        ...previous,
        analysisCellId: value.analysisCellId,
        parameter: value.parameter,
        from: numberInput(value.from),
        to: numberInput(value.to),
        steps: numberInput(value.steps),
      };
      for (const key of Object.keys(inputs)) if (inputs[key] === undefined) delete inputs[key];
      return inputs;
    },
  });

  protected readonly analysisCells = computed(() => this.session.cells().filter((c) => c.kind === 'analysis'));
  protected readonly parameter = computed(() => (this.cell().inputs['parameter'] as Parameter) ?? 'nCrit');
  protected readonly result = computed(() => (shownResult(this.cell())?.output.result as SweepResult | undefined) ?? null);

  protected readonly surfaceNames = computed(() => {
    const names = new Set<string>();
    for (const step of this.result()?.steps ?? []) for (const s of step.surfaces) names.add(s.name);
    return [...names];
  });

  protected readonly figure = computed((): PlotFigure | null => {
    const result = this.result();
    if (!result) return null;
    const traces: PlotTrace[] = this.surfaceNames().map((name, i) => ({
      x: result.steps.map((s) => s.value),
      y: result.steps.map((s) => {
        const surface = s.surfaces.find((x) => x.name === name);
        return surface ? (surface.transitionX ?? surface.transitionS) : null;
      }),
      name: `${name} transition`,
      mode: 'lines+markers',
      color: PLOT_COLOURS[i % PLOT_COLOURS.length],
    }));
    return {
      x: { title: this.labels[result.parameter], log: result.parameter === 'reynolds' },
      y: { title: 'governing transition x/c', range: [0, 1] },
      traces,
    };
  });

  protected value(value: number): string {
    return this.parameter() === 'reynolds' ? sci(value) : String(Number(value.toPrecision(6)));
  }

  protected location(step: SweepResult['steps'][number], name: string): string {
    const surface = step.surfaces.find((s) => s.name === name);
    const at = surface ? (surface.transitionX ?? surface.transitionS) : null;
    const by = surface?.by ? (CAUSE_LABELS[surface.by as keyof typeof CAUSE_LABELS] ?? surface.by) : null;
    return at === null || at === undefined ? '—' : `${at.toFixed(3)}${by ? ` (${by})` : ''}`;
  }

  protected cd(value: number | null): string {
    return value === null ? '—' : value.toFixed(5);
  }

  protected cellTitle(cell: DraftCell): string {
    return cell.title.trim() || 'Untitled';
  }

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }
}
