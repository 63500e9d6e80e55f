import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { MatTabsModule } from '@angular/material/tabs';
import { ENGINE_CAUTION } from '@laminote/aero/caution';
import type { ComparisonResult, DraftCell } from '@laminote/contracts';
import { CELL_KIND_LABELS } from '@laminote/contracts/cell-kinds';
import { readableMessage } from '@laminote/contracts/field-words';
import { CAUSE_LABELS } from '../../shared/analysis-summary';
import { DraftSession } from '../../shared/draft-session';
import { PLOT_COLOURS, Plot, type PlotFigure, type PlotMarker, type PlotTrace } from '../../shared/plot';
import { bindCellForm } from '../cell-form';
import { CellResult, shownResult } from '../cell-result';

const FIELDS = ['firstCellId', 'secondCellId', 'thirdCellId', 'fourthCellId'] as const;
type Field = (typeof FIELDS)[number];
type FormValue = Record<Field, string>;

const FIELD_NAMES: Record<Field, string> = { firstCellId: 'First cell', secondCellId: 'Second cell', thirdCellId: 'Third cell', fourthCellId: 'Fourth cell' };
const DASHES = ['solid', 'dash', 'dot', 'dashdot'] as const;

interface Overlay {
  readonly id: 'cp' | 'n' | 'h';
  readonly tab: string;
  readonly label: string;
  readonly figure: PlotFigure;
}

/**
 * Comparison: two to four pressure cells or analyses of the study overlaid, surface by surface (Cp for
 * all; N-factor and H with each analysis's transition for analyses), and a table of where transition
 * falls and what the drag is.
 */
@Component({
  selector: 'lam-comparison-cell',
  imports: [CellResult, MatFormFieldModule, MatSelectModule, MatTabsModule, Plot, ReactiveFormsModule],
  template: `
    <form [formGroup]="form" (submit)="$event.preventDefault()">
      <div class="fields">
        @for (field of fields; track field; let i = $index) {
          <mat-form-field class="field wide">
            <mat-label>{{ fieldNames[field] }}{{ i > 1 ? ' (optional)' : '' }}</mat-label>
            <mat-select [formControlName]="field" [attr.data-field]="field">
              @if (i > 1) {
                <mat-option value="">None</mat-option>
              }
              @for (c of choices(); track c.cellId) {
                <mat-option [value]="c.cellId">{{ title(c) }} · {{ kindLabels[c.kind] }}</mat-option>
              } @empty {
                <mat-option disabled>Add a pressure cell or an analysis first</mat-option>
              }
            </mat-select>
            <mat-error>{{ problem(field) }}</mat-error>
          </mat-form-field>
        }
      </div>
    </form>

    @if (result(); as r) {
      <lam-cell-result [cell]="cell()">
        @for (s of surfaces(); track s.name) {
          <section class="surface" [attr.aria-label]="'Overlay on the ' + s.name + ' surface'">
            <h4>{{ s.name }}</h4>
            <mat-tab-group animationDuration="0ms" [attr.aria-label]="'Overlaid plots, ' + s.name">
              @for (o of s.overlays; track o.id) {
                <mat-tab [label]="o.tab">
                  <ng-template matTabContent>
                    <lam-plot [figure]="o.figure" [label]="o.label" [height]="280" />
                  </ng-template>
                </mat-tab>
              }
            </mat-tab-group>
          </section>
        }
        @if (rows().length > 0) {
          <table class="quantities" aria-label="Transition and drag of the compared analyses">
            <thead>
              <tr>
                <th scope="col">Cell</th>
                <th scope="col">Surface</th>
                <th scope="col">Transition x/c</th>
                <th scope="col">c_d (surface)</th>
                <th scope="col">Re · M · N_crit</th>
              </tr>
            </thead>
            <tbody>
              @for (row of rows(); track $index) {
                <tr>
                  <td>{{ row.cell }}</td>
                  <td>{{ row.surface }}</td>
                  <td class="lam-mono">{{ row.transition }}</td>
                  <td class="lam-mono">{{ row.cd }}</td>
                  <td class="lam-mono">{{ row.flow }}</td>
                </tr>
              }
            </tbody>
          </table>
        }
        @for (warning of r.warnings; track warning) {
          <p class="warning">{{ readable(warning) }}</p>
        }
        <p class="lam-caution">{{ caution }}</p>
      </lam-cell-result>
    }
  `,
  styleUrl: '../simple-cell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ComparisonCell {
  private readonly session = inject(DraftSession);

  readonly cell = input.required<DraftCell>();

  protected readonly fields = FIELDS;
  protected readonly fieldNames = FIELD_NAMES;
  protected readonly kindLabels = CELL_KIND_LABELS;
  protected readonly caution = ENGINE_CAUTION;

  protected readonly form = new FormGroup({
    firstCellId: new FormControl('', { nonNullable: true }),
    secondCellId: new FormControl('', { nonNullable: true }),
    thirdCellId: new FormControl('', { nonNullable: true }),
    fourthCellId: new FormControl('', { nonNullable: true }),
  });

  private readonly binding = bindCellForm<FormValue>({
    form: this.form,
    cell: this.cell,
    toForm: (inputs) => Object.fromEntries(FIELDS.map((f) => [f, typeof inputs[f] === 'string' ? inputs[f] : ''])) as FormValue,
    // An optional cell left at "None" is null, as the schema keeps it.
    fromForm: (value, previous) => ({ ...previous, ...Object.fromEntries(FIELDS.map((f, i) => [f, value[f] === '' && i > 1 ? null : value[f]])) }),
  });

  /** The cells a comparison may overlay: pressure cells and analyses, in the stack's order. */
  protected readonly choices = computed(() => this.session.cells().filter((c) => c.kind === 'pressure' || c.kind === 'analysis'));
  protected readonly result = computed(() => (shownResult(this.cell())?.output.result as ComparisonResult | undefined) ?? null);

  /** What each entry is called: the title of the cell its field names. */
  private readonly names = computed(() => {
    const inputs = this.cell().inputs;
    const byId = new Map(this.session.cells().map((c) => [c.cellId, c]));
    return (field: string) => {
      const named = byId.get(String(inputs[field] ?? ''));
      return named ? this.title(named) : FIELD_NAMES[field as Field] ?? field;
    };
  });

  protected readonly surfaces = computed(() => {
    const r = this.result();
    if (!r) return [];
    const name = this.names();
    const surfaceNames = [...new Set(r.entries.flatMap((e) => e.surfaces.map((s) => s.name)))];
    return surfaceNames.map((surface) => {
      const traces = (pick: (s: ComparisonResult['entries'][number]['surfaces'][number]) => readonly (number | null)[] | null) =>
        r.entries.flatMap((e, i): PlotTrace[] => {
          const s = e.surfaces.find((x) => x.name === surface);
          const y = s ? pick(s) : null;
          return s && y ? [{ x: s.x, y, name: name(e.field), color: PLOT_COLOURS[i % PLOT_COLOURS.length], dash: DASHES[i % DASHES.length] }] : [];
        });
      const markers: PlotMarker[] = r.entries.flatMap((e, i) => {
        const at = e.surfaces.find((x) => x.name === surface)?.transitionX;
        return at === null || at === undefined ? [] : [{ at, axis: 'x' as const, label: `${name(e.field)}: transition`, color: PLOT_COLOURS[i % PLOT_COLOURS.length], dash: 'dot' as const }];
      });
      const x = { title: 'x/c' };
      const overlays: Overlay[] = [{ id: 'cp', tab: 'Cp', label: `Pressure coefficient along the ${surface} surface, each compared cell`, figure: { x, y: { title: 'Cp', reversed: true }, traces: traces((s) => s.cp), markers } }];
      if (r.entries.some((e) => e.kind === 'analysis')) {
        overlays.push(
          { id: 'n', tab: 'N-factor', label: `N-factor envelope along the ${surface} surface, each compared analysis`, figure: { x, y: { title: 'N (envelope amplification exponent)' }, traces: traces((s) => s.n), markers } },
          { id: 'h', tab: 'H', label: `Shape factor H along the ${surface} surface, each compared analysis`, figure: { x, y: { title: 'H = δ*/θ' }, traces: traces((s) => s.H), markers } },
        );
      }
      return { name: surface, overlays };
    });
  });

  protected readonly rows = computed(() => {
    const r = this.result();
    if (!r) return [];
    const name = this.names();
    return r.entries
      .filter((e) => e.kind === 'analysis')
      .flatMap((e) =>
        e.surfaces.map((s) => ({
          cell: name(e.field),
          surface: s.name,
          transition: s.transitionX === null ? 'none on the surface' : `${s.transitionX.toFixed(3)}${s.by ? ` (${CAUSE_LABELS[s.by as keyof typeof CAUSE_LABELS] ?? s.by})` : ''}`,
          cd: s.cd === null ? '—' : s.cd.toFixed(5),
          flow: e.flow ? `${e.flow.reynolds.toExponential(2)} · ${e.flow.mach.toFixed(3)} · ${e.flow.nCrit.toFixed(2)}` : '—',
        })),
      );
  });

  protected title(cell: DraftCell): string {
    return cell.title.trim() || CELL_KIND_LABELS[cell.kind];
  }

  protected readable(message: string): string {
    return readableMessage(message, 'comparison');
  }

  protected problem(control: string): string {
    return this.binding.problems().get(control) ?? '';
  }
}
