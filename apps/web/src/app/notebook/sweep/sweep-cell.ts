import { ReadablePipe } from '../../shared/readable';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ENGINE_CAUTION } from '@laminote/aero/caution';
import type { DraftCell, SweepInputs, SweepResult } from '@laminote/contracts';
import { SWEEP_RANGES } from '@laminote/contracts/limits';
import { PLOT_COLOURS, Plot, type PlotFigure, type PlotTrace } from '../../shared/plot';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { DraftSession } from '../../shared/draft-session';
import { CAUSE_LABELS, CRITERION_LABELS } from '../../shared/analysis-summary';
import { rangeText, sci } from '../../shared/format';
import { PARAMETER_LABELS } from '../../shared/sweep-parameters';

type Parameter = SweepInputs['parameter'];

interface SweepFormValue {
  analysisCellId: string;
  parameter: Parameter;
  from: string;
  to: string;
  steps: string;
  /** A second parameter varied at every value of the first: a grid. */
  grid: boolean;
  parameter2: Parameter;
  from2: string;
  to2: string;
  steps2: string;
}

/** A grid's second parameter as its controls are named. */
const SECOND_CONTROLS: Record<string, string> = { parameter: 'parameter2', from: 'from2', to: 'to2', steps: 'steps2' };

/** Rows of a long sweep's table: beyond this, every n-th step (the download has them all). */
const TABLE_ROWS = 120;


/** Parameter sweep: one analysis re-run over a range of one parameter, to see whether the laminar run survives off-design. */
@Component({
  selector: 'lam-sweep-cell',
  imports: [ReadablePipe, CellResult, MatCheckboxModule, MatFormFieldModule, MatInputModule, MatSelectModule, Plot, ReactiveFormsModule],
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
    grid: new FormControl(false, { nonNullable: true }),
    parameter2: new FormControl<Parameter>('mach', { nonNullable: true }),
    from2: new FormControl('', { nonNullable: true }),
    to2: new FormControl('', { nonNullable: true }),
    steps2: new FormControl('', { nonNullable: true }),
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
      ...secondForm(inputs['second']),
    }),
    fromForm: (value, previous) => {
      const inputs: Record<string, unknown> = {
        ...previous,
        analysisCellId: value.analysisCellId,
        parameter: value.parameter,
        from: numberInput(value.from),
        to: numberInput(value.to),
        steps: numberInput(value.steps),
        second: value.grid ? { parameter: value.parameter2, from: numberInput(value.from2), to: numberInput(value.to2), steps: numberInput(value.steps2) } : undefined,
      };
      for (const key of Object.keys(inputs)) if (inputs[key] === undefined) delete inputs[key];
      return inputs;
    },
    controlOf: (field) => (field.startsWith('second.') ? SECOND_CONTROLS[field.split('.')[1]!] : field.split('.')[0]),
  });

  protected readonly analysisCells = computed(() => this.session.cells().filter((c) => c.kind === 'analysis'));
  protected readonly parameter = computed(() => (this.cell().inputs['parameter'] as Parameter) ?? 'nCrit');
  protected readonly result = computed(() => (shownResult(this.cell())?.output.result as SweepResult | undefined) ?? null);

  protected readonly surfaceNames = computed(() => {
    const names = new Set<string>();
    for (const step of this.result()?.steps ?? []) for (const s of step.surfaces) names.add(s.name);
    return [...names];
  });

  /** The steps the table lists: all of a short sweep, every n-th of a long one (the last always). */
  protected readonly tableSteps = computed(() => {
    const steps = this.result()?.steps ?? [];
    if (steps.length <= TABLE_ROWS) return steps;
    const every = Math.ceil(steps.length / TABLE_ROWS);
    return steps.filter((_, i) => i % every === 0 || i === steps.length - 1);
  });

  /** For a grid: one map per surface of where transition is, over both parameters. */
  protected readonly maps = computed((): { name: string; figure: PlotFigure }[] => {
    const result = this.result();
    if (!result?.second) return [];
    const xs = result.values;
    const ys = result.second.values;
    const columns = ys.length;
    return this.surfaceNames().map((name) => ({
      name,
      figure: {
        x: { title: this.labels[result.parameter], log: result.parameter === 'reynolds' },
        y: { title: this.labels[result.second!.parameter], log: result.second!.parameter === 'reynolds' },
        traces: [],
        map: {
          x: xs,
          y: ys,
          // z[j][i]: row j is the second parameter's j-th value.
          z: ys.map((_, j) =>
            xs.map((__, i) => {
              const surface = result.steps[i * columns + j]?.surfaces.find((x) => x.name === name);
              return surface ? (surface.transitionX ?? surface.transitionS) : null;
            }),
          ),
          title: `${name} transition x/c`,
          range: [0, 1],
        },
      },
    }));
  });

  protected readonly figure = computed((): PlotFigure | null => {
    const result = this.result();
    if (!result || result.second) return null;
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

  /**
   * Beside the governing transition: every evaluated criterion's transition, the laminar extent and the
   * drag against the swept parameter (one-parameter sweeps; older results without them show none).
   */
  protected readonly moreFigures = computed((): { id: string; label: string; figure: PlotFigure }[] => {
    const result = this.result();
    if (!result || result.second) return [];
    const x = { title: this.labels[result.parameter], log: result.parameter === 'reynolds' };
    const values = result.steps.map((s) => s.value);
    const names = this.surfaceNames();
    const dashes = ['dash', 'dot', 'dashdot', 'solid'] as const;
    const criteria = [...new Set(result.steps.flatMap((s) => s.surfaces.flatMap((surface) => Object.keys(surface.criteria ?? {}))))];
    const at = (name: string, pick: (surface: SweepResult['steps'][number]['surfaces'][number]) => number | null | undefined) =>
      result.steps.map((s) => {
        const surface = s.status === 'ok' ? s.surfaces.find((x) => x.name === name) : undefined;
        return surface ? (pick(surface) ?? null) : null;
      });
    const figures: { id: string; label: string; figure: PlotFigure }[] = [];
    if (criteria.length > 0) {
      const traces: PlotTrace[] = names.flatMap((name, i) =>
        criteria.map((criterion, k) => ({
          x: values,
          y: at(name, (surface) => surface.criteria?.[criterion]),
          name: `${name}: ${CRITERION_LABELS[criterion as keyof typeof CRITERION_LABELS] ?? criterion}`,
          mode: 'lines+markers' as const,
          color: PLOT_COLOURS[i % PLOT_COLOURS.length],
          dash: dashes[k % dashes.length],
          markerSize: 4,
        })),
      );
      figures.push({ id: 'criteria', label: 'Transition by every criterion against the swept parameter', figure: { x, y: { title: 'transition x/c', range: [0, 1] }, traces } });
    }
    if (result.steps.some((s) => s.surfaces.some((surface) => surface.laminarExtent !== undefined))) {
      const traces: PlotTrace[] = names.map((name, i) => ({ x: values, y: at(name, (surface) => surface.laminarExtent), name: `${name} laminar run`, mode: 'lines+markers', color: PLOT_COLOURS[i % PLOT_COLOURS.length] }));
      figures.push({ id: 'extent', label: 'Laminar extent against the swept parameter', figure: { x, y: { title: 'laminar to x/c', range: [0, 1] }, traces } });
    }
    const drag: PlotTrace[] = [
      { x: values, y: result.steps.map((s) => (s.cd === null ? null : s.cd * 1e4)), name: 'section c_d', mode: 'lines+markers', color: PLOT_COLOURS[1], width: 2.25 },
      ...names.map((name, i) => ({ x: values, y: at(name, (surface) => (surface.cd === null ? null : surface.cd * 1e4)), name: `${name} c_d`, mode: 'lines+markers' as const, color: PLOT_COLOURS[(i + 2) % PLOT_COLOURS.length], dash: 'dash' as const })),
    ];
    figures.push({ id: 'drag', label: 'Profile drag against the swept parameter', figure: { x, y: { title: 'c_d (counts, 1 count = 0.0001)' }, traces: drag } });
    return figures;
  });

  protected value(value: number, parameter: Parameter = this.parameter()): string {
    return parameter === 'reynolds' ? sci(value) : String(Number(value.toPrecision(6)));
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

/** The grid's controls from a sweep's `second` input (absent: no grid, the controls keep a start). */
function secondForm(second: unknown): Pick<SweepFormValue, 'grid' | 'parameter2' | 'from2' | 'to2' | 'steps2'> {
  const s = (second && typeof second === 'object' ? second : null) as Record<string, unknown> | null;
  return {
    grid: s !== null,
    parameter2: (s?.['parameter'] as Parameter | undefined) ?? 'mach',
    from2: s ? numberText(s['from']) : '',
    to2: s ? numberText(s['to']) : '',
    steps2: s ? numberText(s['steps']) : '',
  };
}
