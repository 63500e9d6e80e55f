import { ReadablePipe } from '../../shared/readable';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  POLL_CONTAMINATION_RE_BAR,
  POLL_INSTABILITY_RE_BAR,
  attachmentLineReynolds,
  attachmentLineReynoldsFromRadius,
  attachmentLineVerdict,
} from '@laminote/aero/attachment-line';
import { deriveFlowCondition } from '@laminote/aero/flow-condition';
import type { AttachmentLineVerdict, DraftCell, LeadingEdgeResult } from '@laminote/contracts';
import { bindCellForm, numberInput, numberText } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';
import { DraftSession } from '../../shared/draft-session';
import { sci } from '../../shared/format';

type Mode = 'radius' | 'gradient';

interface LeadingEdgeFormValue {
  flowCellId: string;
  sweepDeg: string;
  mode: Mode;
  leadingEdgeRadius: string;
  velocityGradient: string;
  reynolds: string;
}

/** No flow cell: the Reynolds number is typed into this cell. */
const OWN_REYNOLDS = '';

export const VERDICT_TEXT: Record<AttachmentLineVerdict, { label: string; icon: string; meaning: string }> = {
  laminar: { label: 'Attachment line stays laminar', icon: 'check_circle', meaning: `R̄ below ${POLL_CONTAMINATION_RE_BAR}` },
  contaminationRisk: {
    label: 'Contamination risk',
    icon: 'warning',
    meaning: `R̄ between ${POLL_CONTAMINATION_RE_BAR} and ${POLL_INSTABILITY_RE_BAR}: turbulence from the wing–body junction can spread along the leading edge`,
  },
  unstable: { label: 'Attachment line unstable', icon: 'error', meaning: `R̄ above ${POLL_INSTABILITY_RE_BAR}: the attachment line turns turbulent by itself` },
};

function num(value: unknown): number | undefined {
  return typeof value === 'number' && Number.isFinite(value) ? value : undefined;
}

/** Leading-edge check: Poll's attachment-line Reynolds number R̄ from sweep and radius or velocity gradient. */
@Component({
  selector: 'lam-leading-edge-cell',
  imports: [ReadablePipe, CellResult, MatButtonToggleModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './leading-edge-cell.html',
  styleUrl: '../simple-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LeadingEdgeCell {
  private readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly ownReynolds = OWN_REYNOLDS;
  protected readonly form = new FormGroup({
    flowCellId: new FormControl(OWN_REYNOLDS, { nonNullable: true }),
    sweepDeg: new FormControl('', { nonNullable: true }),
    mode: new FormControl<Mode>('radius', { nonNullable: true }),
    leadingEdgeRadius: new FormControl('', { nonNullable: true }),
    velocityGradient: new FormControl('', { nonNullable: true }),
    reynolds: new FormControl('', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<LeadingEdgeFormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => ({
      flowCellId: typeof inputs['flowCellId'] === 'string' ? inputs['flowCellId'] : OWN_REYNOLDS,
      sweepDeg: numberText(inputs['sweepDeg']),
      mode: inputs['mode'] === 'gradient' ? 'gradient' : 'radius',
      leadingEdgeRadius: numberText(inputs['leadingEdgeRadius']),
      velocityGradient: numberText(inputs['velocityGradient']),
      reynolds: numberText(inputs['reynolds']),
    }),
    fromForm: (value, previous) => {
      const inputs: Record<string, unknown> = {
        ...previous,
        flowCellId: value.flowCellId === OWN_REYNOLDS ? null : value.flowCellId,
        sweepDeg: numberInput(value.sweepDeg),
        mode: value.mode,
        leadingEdgeRadius: numberInput(value.leadingEdgeRadius),
        velocityGradient: numberInput(value.velocityGradient),
        reynolds: numberInput(value.reynolds),
      };
      for (const key of Object.keys(inputs)) if (inputs[key] === undefined) delete inputs[key];
      return inputs;
    },
  });

  protected readonly flowCells = computed(() => this.session.cells().filter((c) => c.kind === 'flow'));
  protected readonly inputs = computed(() => this.cell().inputs);
  protected readonly mode = computed(() => (this.inputs()['mode'] === 'gradient' ? 'gradient' : 'radius'));
  protected readonly usesFlowCell = computed(() => typeof this.inputs()['flowCellId'] === 'string');

  /** The Reynolds number the check uses: the named flow cell's, worked out from its inputs, or typed here. */
  private readonly reynolds = computed((): number | undefined => {
    const flowId = this.inputs()['flowCellId'];
    if (typeof flowId !== 'string') return num(this.inputs()['reynolds']);
    const flow = this.session.cell(flowId);
    if (!flow) return undefined;
    const f = flow.inputs;
    try {
      return f['mode'] === 'reynolds'
        ? deriveFlowCondition({ reynolds: num(f['reynolds']) ?? Number.NaN, mach: num(f['mach']) ?? 0 }).reynolds
        : deriveFlowCondition({
            altitude_m: num(f['altitude_m']),
            isaTemperatureOffset_K: num(f['isaTemperatureOffset_K']) ?? 0,
            mach: num(f['mach']) ?? Number.NaN,
            referenceLength_m: num(f['referenceLength_m']),
          }).reynolds;
    } catch {
      return undefined;
    }
  });

  protected readonly check = computed((): { reynolds: number; reBar: number; verdict: AttachmentLineVerdict; asRun: boolean } | null => {
    const shown = shownResult(this.cell());
    if (shown && this.cell().runState === 'current') {
      const r = shown.output.result as LeadingEdgeResult;
      return { reynolds: r.reynolds, reBar: r.reBar, verdict: r.verdict, asRun: true };
    }
    const reynolds = this.reynolds();
    const sweep = num(this.inputs()['sweepDeg']);
    if (reynolds === undefined || sweep === undefined) return null;
    const reBar =
      this.mode() === 'radius'
        ? attachmentLineReynoldsFromRadius(reynolds, sweep, num(this.inputs()['leadingEdgeRadius']) ?? Number.NaN)
        : attachmentLineReynolds(reynolds, sweep, num(this.inputs()['velocityGradient']) ?? Number.NaN);
    if (!Number.isFinite(reBar)) return null;
    return { reynolds, reBar, verdict: attachmentLineVerdict(reBar), asRun: false };
  });

  protected readonly verdictText = VERDICT_TEXT;
  protected readonly warnings = computed(() => {
    const shown = shownResult(this.cell());
    return shown && this.cell().runState === 'current' ? (shown.output.result as LeadingEdgeResult).warnings : [];
  });

  protected sci(value: number): string {
    return sci(value);
  }

  protected cellTitle(cell: DraftCell): string {
    return cell.title.trim() || 'Untitled';
  }

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }
}
