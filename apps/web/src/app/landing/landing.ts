import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Auth } from '../core/auth';
import { problemMessage } from '../core/problem';

/** The signed-out front page: what Laminote is for, and the way in. */
@Component({
  selector: 'lam-landing',
  imports: [MatButtonModule, MatIconModule],
  templateUrl: './landing.html',
  styleUrl: './landing.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Landing {
  private readonly auth = inject(Auth);

  /** From the query string: where to come back to after signing in. */
  readonly returnTo = input<string | undefined>();
  /** From the query string: `session-ended` when an expired session sent the person here. */
  readonly reason = input<string | undefined>();

  protected readonly sessionEnded = computed(() => this.reason() === 'session-ended');
  protected readonly serverTrouble = computed(() => {
    const state = this.auth.state();
    return state.status === 'unavailable' ? problemMessage(state.problem) : null;
  });

  protected signIn(): void {
    this.auth.signIn(this.returnTo() ?? '/projects');
  }
}
