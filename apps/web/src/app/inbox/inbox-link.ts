import { ChangeDetectionStrategy, Component, computed, effect, inject } from '@angular/core';
import { MatBadgeModule } from '@angular/material/badge';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { Auth } from '../core/auth';
import { UnreadCount } from './unread-count';

/** The top bar's way to the inbox, with the number of unread entries. */
@Component({
  selector: 'lam-inbox-link',
  imports: [MatBadgeModule, MatButtonModule, MatIconModule, MatTooltipModule, RouterLink],
  template: `
    <a mat-icon-button class="inbox-link" routerLink="/inbox" [attr.aria-label]="label()" [matTooltip]="label()">
      <mat-icon aria-hidden="true" [matBadge]="badge()" [matBadgeHidden]="unread() === 0" matBadgeSize="medium" matBadgeColor="accent" aria-hidden="true"
        >inbox</mat-icon
      >
    </a>
  `,
  styles: `
    .inbox-link {
      color: var(--lam-on-ink);
      --mat-focus-indicator-border-color: var(--lam-copper);
      --mat-badge-background-color: var(--lam-copper);
      --mat-badge-text-color: #fff;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InboxLink {
  private readonly count = inject(UnreadCount);
  protected readonly unread = this.count.value;
  protected readonly badge = computed(() => (this.unread() > 99 ? '99+' : String(this.unread())));
  protected readonly label = computed(() => (this.unread() === 0 ? 'Inbox: nothing unread' : `Inbox: ${this.unread()} unread`));

  constructor() {
    const auth = inject(Auth);
    effect(() => (auth.signedIn() ? this.count.start() : this.count.stop()));
  }
}
