import { ReadablePipe } from '../../shared/readable';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { ENGINE_CAUTION } from '@laminote/aero/caution';
import type { AnalysisInputs, DraftCell, EngineResult } from '@laminote/contracts';
import { TRANSITION_CRITERIA, type TransitionCriterion } from '@laminote/contracts/cell-kinds';
import { Plot } from '../../shared/plot';
import { ScrollCue } from '../../shared/scroll-cue';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { DraftSession } from '../../shared/draft-session';
import { sci } from '../../shared/format';
import { CRITERION_LABELS, type Location, analysisFigures, isBodyResult, summarise } from '../../shared/analysis-summary';
import { analysisOutlineFigure } from '../section/section-figures';

interface AnalysisFormValue {
  flowCellId: string;
  pressureCellId: string;
  eN: boolean;
  crossflow: boolean;
  crossflowC1: boolean;
  michel: boolean;
  hRx: boolean;
  granville: boolean;
  tripA: string;
  tripB: string;
  turbulent: boolean;
  governing: Governing;
}

type Governing = AnalysisInputs['governing'];

/**
 * Transition analysis: the boundary layer marched along each surface of a pressure cell at a flow
 * cell's condition. Shows where each criterion puts transition and which one governs, separation,
 * the laminar extent and the drag, with the engine's plots and its caution.
 */
@Component({
  selector: 'lam-analysis-cell',
  imports: [
    ReadablePipe,
    CellResult,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    MatSlideToggleModule,
    Plot,
    ReactiveFormsModule,
    ScrollCue,
  ],
  templateUrl: './analysis-cell.html',
  styleUrl: './analysis-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AnalysisCell {
  private readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly criteriaIds = TRANSITION_CRITERIA;
  protected readonly criterionLabels = CRITERION_LABELS;
  protected readonly caution = ENGINE_CAUTION;

  protected readonly form = new FormGroup({
    flowCellId: new FormControl('', { nonNullable: true }),
    pressureCellId: new FormControl('', { nonNullable: true }),
    eN: new FormControl(true, { nonNullable: true }),
    crossflow: new FormControl(true, { nonNullable: true }),
    crossflowC1: new FormControl(true, { nonNullable: true }),
    michel: new FormControl(true, { nonNullable: true }),
    hRx: new FormControl(true, { nonNullable: true }),
    granville: new FormControl(true, { nonNullable: true }),
    tripA: new FormControl('', { nonNullable: true }),
    tripB: new FormControl('', { nonNullable: true }),
    turbulent: new FormControl(true, { nonNullable: true }),
    governing: new FormControl<Governing>('auto', { nonNullable: true }),
  });

  protected readonly flowCells = computed(() => this.session.cells().filter((c) => c.kind === 'flow'));
  protected readonly pressureCells = computed(() => this.session.cells().filter((c) => c.kind === 'pressure' || c.kind === 'section' || c.kind === 'body'));
  /** A body of revolution is analysed in free transition: no trips to offer. */
  protected readonly namesBody = computed(() => this.session.cell(String(this.cell().inputs['pressureCellId'] ?? ''))?.kind === 'body');

  /** The surfaces that can be tripped: upper and lower of a closed loop, or a single surface by its name. */
  protected readonly tripSurfaces = computed((): [string, string | null] => {
    const pressure = this.session.cell(String(this.cell().inputs['pressureCellId'] ?? ''));
    if (pressure?.inputs['layout'] === 'surface') return [String(pressure.inputs['surfaceName'] ?? 'upper'), null];
    return ['upper', 'lower'];
  });

  private readonly binding = bindCellForm<AnalysisFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => {
      const criteria = Array.isArray(inputs['criteria']) ? (inputs['criteria'] as string[]) : [];
      const trips = (inputs['trips'] ?? {}) as Record<string, unknown>;
      const [a, b] = this.tripSurfaces();
      return {
        flowCellId: String(inputs['flowCellId'] ?? ''),
        pressureCellId: String(inputs['pressureCellId'] ?? ''),
        eN: criteria.includes('eN'),
        crossflow: criteria.includes('crossflow'),
        crossflowC1: criteria.includes('crossflowC1'),
        michel: criteria.includes('michel'),
        hRx: criteria.includes('hRx'),
        granville: criteria.includes('granville'),
        tripA: numberText(trips[a]),
        tripB: b ? numberText(trips[b]) : '',
        turbulent: inputs['turbulent'] !== false,
        governing: (typeof inputs['governing'] === 'string' ? inputs['governing'] : 'auto') as Governing,
      };
    },
    fromForm: (value, previous) => {
      const [a, b] = this.tripSurfaces();
      const trips: Record<string, unknown> = {};
      const tripA = numberInput(value.tripA);
      const tripB = numberInput(value.tripB);
      if (tripA !== undefined) trips[a] = tripA;
      if (b && tripB !== undefined) trips[b] = tripB;
      return {
        ...previous,
        flowCellId: value.flowCellId,
        pressureCellId: value.pressureCellId,
        criteria: TRANSITION_CRITERIA.filter((id) => value[id]),
        trips,
        turbulent: value.turbulent,
        governing: value.governing,
      };
    },
    controlOf: (field) => {
      if (field.startsWith('trips.')) return field.slice(6) === this.tripSurfaces()[0] ? 'tripA' : 'tripB';
      if (field.startsWith('criteria')) return 'eN';
      return field.split('.')[0];
    },
  });

  protected readonly criteriaProblem = computed(() => {
    for (const [field, message] of this.binding.problems()) if (field.startsWith('criteria')) return message;
    return null;
  });

  protected readonly shown = computed(() => shownResult(this.cell()));
  protected readonly result = computed(() => (this.shown()?.output.result as EngineResult | undefined) ?? null);

  /** The criteria the shown result was computed with (columns of the summary). */
  protected readonly resultCriteria = computed((): TransitionCriterion[] => {
    const result = this.result();
    if (!result) return [];
    return TRANSITION_CRITERIA.filter((id) => result.surfaces.some((s) => s.transition.criteria[id] !== undefined));
  });
  protected readonly summary = computed(() => {
    const result = this.result();
    return result ? summarise(result, this.resultCriteria()) : [];
  });
  /** A body of revolution named in place of a pressure cell: locations on its length, no drag coefficient. */
  protected readonly body = computed(() => {
    const result = this.result();
    return result !== null && isBodyResult(result);
  });
  protected readonly figures = computed(() => {
    const result = this.result();
    return result ? analysisFigures(result) : [];
  });
  protected readonly flow = computed(() => this.result()?.flow ?? null);
  /** With a section cell named: its outline, marked where each criterion puts transition (issue 14). */
  protected readonly outline = computed(() => {
    const result = this.result();
    return result ? analysisOutlineFigure(result, this.resultCriteria()) : null;
  });

  protected problem(control: string): string {
    const problems = this.binding.problems();
    if (control === 'tripA' || control === 'tripB') {
      const [a, b] = this.tripSurfaces();
      return problems.get(`trips.${control === 'tripA' ? a : b}`) ?? '';
    }
    return problems.get(control) ?? '';
  }

  protected location(at: Location | null | undefined): string {
    return at ? at.value.toFixed(3) : '—';
  }

  protected sci(value: number | null | undefined): string {
    return sci(value);
  }

  protected cd(value: number | null): string {
    return value === null ? '—' : value.toFixed(5);
  }

  protected cellTitle(cell: DraftCell): string {
    return cell.title.trim() || 'Untitled';
  }
}
