import { ReadablePipe } from '../../shared/readable';
import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { DraftCell, PolarInputs, PolarResult } from '@laminote/contracts';
import { SECTION_LIMITS } from '@laminote/contracts/limits';
import { TRANSITION_CRITERIA, type TransitionCriterion } from '@laminote/contracts/cell-kinds';
import { Plot } from '../../shared/plot';
import { CRITERION_LABELS } from '../../shared/analysis-summary';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { DraftSession } from '../../shared/draft-session';
import { dragPolarFigure, liftCurveFigure, outlineFigure, transitionFigure, type OutlineMark } from '../section/section-figures';

interface PolarFormValue {
  flowCellId: string;
  sectionCellId: string;
  by: 'alpha' | 'cl';
  from: string;
  to: string;
  points: string;
  criteria: Record<TransitionCriterion, boolean>;
  governing: PolarInputs['governing'];
}

type Point = PolarResult['points'][number];

/**
 * Polar: a section cell's shape over a range of incidence or lift at a flow cell's Reynolds and Mach
 * numbers — drag against lift (the low-drag bucket), lift against incidence, transition against lift,
 * and the outline with where each criterion puts transition at a chosen point.
 */
@Component({
  selector: 'lam-polar-cell',
  imports: [ReadablePipe, CellResult, DecimalPipe, MatButtonToggleModule, MatCheckboxModule, MatFormFieldModule, MatInputModule, MatSelectModule, Plot, ReactiveFormsModule],
  templateUrl: './polar-cell.html',
  styleUrls: ['../simple-cell.scss', '../shape-cell.scss', './polar-cell.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PolarCell {
  private readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly maxPoints = SECTION_LIMITS.maxPolarPoints;
  protected readonly criteriaIds = TRANSITION_CRITERIA;
  protected readonly criterionLabels = CRITERION_LABELS;
  protected readonly form = new FormGroup({
    flowCellId: new FormControl('', { nonNullable: true }),
    sectionCellId: new FormControl('', { nonNullable: true }),
    by: new FormControl<'alpha' | 'cl'>('alpha', { nonNullable: true }),
    from: new FormControl('', { nonNullable: true }),
    to: new FormControl('', { nonNullable: true }),
    points: new FormControl('', { nonNullable: true }),
    criteria: new FormGroup(
      Object.fromEntries(TRANSITION_CRITERIA.map((id) => [id, new FormControl(true, { nonNullable: true })])) as Record<TransitionCriterion, FormControl<boolean>>,
    ),
    governing: new FormControl<PolarInputs['governing']>('auto', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<PolarFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => ({
      flowCellId: String(inputs['flowCellId'] ?? ''),
      sectionCellId: String(inputs['sectionCellId'] ?? ''),
      by: inputs['by'] === 'cl' ? 'cl' : 'alpha',
      from: numberText(inputs['from']),
      to: numberText(inputs['to']),
      points: numberText(inputs['points']),
      // No list stored means the schema's default: every criterion.
      criteria: Object.fromEntries(
        TRANSITION_CRITERIA.map((id) => [id, Array.isArray(inputs['criteria']) ? (inputs['criteria'] as string[]).includes(id) : true]),
      ) as Record<TransitionCriterion, boolean>,
      governing: (typeof inputs['governing'] === 'string' ? inputs['governing'] : 'auto') as PolarInputs['governing'],
    }),
    fromForm: (value, previous) => {
      const inputs: Record<string, unknown> = {
        ...previous,
        flowCellId: value.flowCellId,
        sectionCellId: value.sectionCellId,
        by: value.by,
        from: numberInput(value.from),
        to: numberInput(value.to),
        points: numberInput(value.points),
        criteria: TRANSITION_CRITERIA.filter((id) => value.criteria[id]),
        governing: value.governing,
      };
      for (const key of Object.keys(inputs)) if (inputs[key] === undefined) delete inputs[key];
      return inputs;
    },
  });

  protected readonly criteriaProblem = computed(() => {
    for (const [field, message] of this.binding.problems()) if (field.startsWith('criteria')) return message;
    return null;
  });

  protected readonly flowCells = computed(() => this.session.cells().filter((c) => c.kind === 'flow'));
  protected readonly sectionCells = computed(() => this.session.cells().filter((c) => c.kind === 'section'));
  protected readonly by = computed(() => (this.cell().inputs['by'] === 'cl' ? 'cl' : 'alpha'));

  protected readonly result = computed(() => {
    const shown = shownResult(this.cell());
    return shown ? (shown.output.result as PolarResult) : null;
  });
  protected readonly computed = computed(() => (this.result()?.points ?? []).filter((p) => p.problem === null));
  protected readonly refused = computed(() => (this.result()?.points ?? []).filter((p) => p.problem !== null));

  /** The point whose transition marks the outline shows: picked in the table, else the least drag. */
  private readonly picked = signal<number | null>(null);
  protected readonly marked = computed((): Point | null => {
    const points = this.computed();
    if (points.length === 0) return null;
    const index = this.picked();
    if (index !== null && points[index]) return points[index]!;
    return points.reduce((best, p) => ((p.cd ?? Infinity) < (best.cd ?? Infinity) ? p : best));
  });
  protected readonly markedIndex = computed(() => {
    const m = this.marked();
    return m ? this.computed().indexOf(m) : -1;
  });

  protected readonly figures = computed(() => {
    const r = this.result();
    if (!r || this.computed().length === 0) return null;
    return { drag: dragPolarFigure(r), lift: liftCurveFigure(r), transition: transitionFigure(r) };
  });

  protected readonly outline = computed(() => {
    const r = this.result();
    const point = this.marked();
    if (!r || !point) return null;
    const marks: OutlineMark[] = [];
    for (const s of point.surfaces) {
      const surface = s.name === 'lower' ? 'lower' : 'upper';
      if (s.transitionX !== null) marks.push({ surface, x: s.transitionX, kind: 'transition', label: `${s.name}: transition x/c ${s.transitionX.toFixed(3)} (${this.label(s.transitionBy)})` });
      for (const [criterion, x] of Object.entries(s.criteria)) {
        if (x !== null && criterion !== s.transitionBy) marks.push({ surface, x, kind: 'criterion', label: `${s.name}: ${this.label(criterion)} x/c ${x.toFixed(3)}` });
      }
      if (s.laminarSeparationX !== null) marks.push({ surface, x: s.laminarSeparationX, kind: 'separation', label: `${s.name}: laminar separation x/c ${s.laminarSeparationX.toFixed(3)}` });
      if (s.turbulentSeparationX !== null) marks.push({ surface, x: s.turbulentSeparationX, kind: 'separation', label: `${s.name}: turbulent separation x/c ${s.turbulentSeparationX.toFixed(3)}` });
    }
    return outlineFigure(r.outline, marks);
  });

  protected pick(index: number): void {
    this.picked.set(index);
  }

  protected label(criterion: string | null): string {
    if (criterion === null) return '—';
    if (criterion === 'laminarSeparation') return 'laminar separation';
    if (criterion === 'trip') return 'trip';
    return (CRITERION_LABELS as Record<string, string>)[criterion] ?? criterion;
  }

  protected transitionOf(point: Point, name: string): number | null {
    return point.surfaces.find((s) => s.name === name)?.transitionX ?? null;
  }

  protected cellTitle(cell: DraftCell): string {
    return cell.title.trim() || 'Untitled';
  }

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }
}
