import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, FormGroup, type FormGroupDirective, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { TOKEN_SCOPE_LABELS, type CreatedToken, type TokenScope, type TokenSummary } from '@laminote/contracts';
import { Notifier } from '../core/notifier';
import { loader } from '../shared/load-state';
import { ProblemBanner } from '../shared/problem-banner';
import { TokensApi } from './tokens-api';

const STATE_WORDS: Record<TokenSummary['state'], string> = { active: 'Active', expired: 'Expired', revoked: 'Revoked' };

/**
 * Settings → API tokens: make a token for a script (shown once), see each with its scope, expiry and
 * last use, and revoke it.
 */
@Component({
  selector: 'lam-tokens-page',
  imports: [
    DatePipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ProblemBanner,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './tokens-page.html',
  styleUrl: './tokens-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TokensPage {
  private readonly api = inject(TokensApi);
  private readonly notifier = inject(Notifier);
  private readonly load = loader(() => 0, () => this.api.list());
  protected readonly state = this.load.state;
  /** Changes made here before the list was asked again. */
  private readonly changed = signal<ReadonlyMap<string, TokenSummary>>(new Map());
  protected readonly tokens = computed(() => {
    const changed = this.changed();
    const listed = (this.state().value ?? []).map((t) => changed.get(t.id) ?? t);
    const fresh = [...changed.values()].filter((t) => !listed.some((l) => l.id === t.id));
    return [...fresh, ...listed];
  });
  protected readonly scopeLabels = TOKEN_SCOPE_LABELS;
  protected readonly stateWords = STATE_WORDS;
  protected readonly expiryChoices = [
    { days: 7, label: '7 days' },
    { days: 30, label: '30 days' },
    { days: 90, label: '90 days' },
    { days: 365, label: '1 year' },
  ];
  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(80)] }),
    scope: new FormControl<TokenScope>('read', { nonNullable: true }),
    expiresInDays: new FormControl(30, { nonNullable: true }),
  });
  protected readonly creating = signal(false);
  /** The token just made: shown here once, never again. */
  protected readonly made = signal<CreatedToken | null>(null);

  protected create(formDirective: FormGroupDirective): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.creating.set(true);
    const { name, scope, expiresInDays } = this.form.getRawValue();
    this.api.create({ name: name.trim(), scope, expiresInDays }).subscribe({
      next: (created) => {
        this.creating.set(false);
        this.made.set(created);
        const { token: _shownOnce, ...summary } = created;
        this.changed.update((m) => new Map(m).set(created.id, summary));
        // Through the directive, so the submitted form does not show the emptied name as an error.
        formDirective.resetForm({ name: '', scope: 'read', expiresInDays: 30 });
      },
      error: (error: unknown) => {
        this.creating.set(false);
        this.notifier.formProblem(error, this.form.controls);
      },
    });
  }

  protected async copy(token: string): Promise<void> {
    try {
      await navigator.clipboard.writeText(token);
      this.notifier.done('Token copied');
    } catch {
      this.notifier.done('Select the token and copy it by hand');
    }
  }

  protected revoke(token: TokenSummary): void {
    this.api.revoke(token.id).subscribe({
      next: (revoked) => {
        this.changed.update((m) => new Map(m).set(revoked.id, revoked));
        if (this.made()?.id === revoked.id) this.made.set(null);
        this.notifier.done(`Revoked “${revoked.name}”: scripts using it are refused from now on`);
      },
      error: (error: unknown) => this.notifier.problem(error),
    });
  }

  protected retry(): void {
    this.load.reload();
  }
}
