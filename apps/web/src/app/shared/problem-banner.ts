import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { Problem } from '@laminote/contracts';
import { problemMessage } from '../core/problem';

/** A failed load, said in place of the data, with a way to try again. */
@Component({
  selector: 'lam-problem-banner',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <mat-icon aria-hidden="true">error</mat-icon>
    <span class="message">{{ message() }}</span>
    <button mat-button type="button" (click)="retry.emit()">Try again</button>
  `,
  styleUrl: './problem-banner.scss',
  host: { role: 'alert' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProblemBanner {
  readonly problem = input.required<Problem>();
  readonly retry = output<void>();

  protected readonly message = computed(() => problemMessage(this.problem()));
}
