import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { METHODS } from '@laminote/aero';
import type { ValidationCaseResultDto } from '@laminote/contracts';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { MethodsApi } from './methods-api';

/** Numbers as an engineer reads them: four significant figures, exponent form when very large or small. */
export function formatValue(value: number | null): string {
  if (value === null || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  return magnitude >= 1e5 || magnitude < 1e-3 ? value.toExponential(4) : Number(value.toPrecision(5)).toString();
}

/** A tolerance or a difference: two significant figures are all it carries. */
function short(value: number, signed = false): string {
  const magnitude = Math.abs(value);
  const text = value === 0 ? '0' : magnitude >= 1e5 || magnitude < 1e-3 ? value.toExponential(1) : Number(value.toPrecision(2)).toString();
  return signed && value > 0 ? `+${text}` : text;
}

export function formatTolerance(c: Pick<ValidationCaseResultDto, 'tolerance'>): string {
  return c.tolerance.kind === 'relative' ? `± ${formatPercent(c.tolerance.value)}` : `± ${short(c.tolerance.value)}`;
}

export function formatError(c: Pick<ValidationCaseResultDto, 'tolerance' | 'error'>): string {
  if (c.error === null) return '—';
  return c.tolerance.kind === 'relative' ? formatPercent(c.error, true) : short(c.error, true);
}

function formatPercent(fraction: number, signed = false): string {
  const percent = fraction * 100;
  const text = Math.abs(percent) >= 0.01 || percent === 0 ? `${Number(percent.toPrecision(3))} %` : `${percent.toExponential(1)} %`;
  return signed && percent > 0 ? `+${text}` : text;
}

/**
 * The validation page: every shared reference case of the engine, run on the server — reference,
 * Laminote's value, tolerance, pass or fail, and the source beside each.
 */
@Component({
  selector: 'lam-validation-page',
  imports: [DecimalPipe, MatIconModule, MatProgressBarModule, ProblemBanner, RouterLink],
  templateUrl: './validation-page.html',
  styleUrl: './validation-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ValidationPage {
  private readonly api = inject(MethodsApi);
  private readonly load = loader(() => 0, () => this.api.validation());
  protected readonly state = this.load.state;
  protected readonly report = computed(() => this.state().value);
  protected readonly value = formatValue;
  protected readonly tolerance = formatTolerance;
  protected readonly error = formatError;
  private readonly methodNames = new Map(METHODS.map((m) => [m.id, m.name]));
  private readonly fragment = toSignal(inject(ActivatedRoute).fragment);

  constructor() {
    // A method page links to its suites (#suite-…); they exist once the cases have run.
    effect(() => {
      const id = this.fragment();
      if (id && this.report()) setTimeout(() => document.getElementById(id)?.scrollIntoView({ block: 'start' }));
    });
  }

  protected methodName(id: string): string {
    return this.methodNames.get(id) ?? id;
  }

  protected retry(): void {
    this.load.reload();
  }
}
