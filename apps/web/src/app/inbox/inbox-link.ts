import { ChangeDetectionStrategy, Component, computed, effect, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { Auth } from '../core/auth';
import { UnreadCount } from './unread-count';

/** The top bar's way to the inbox, with the number of unread entries. */
@Component({
  selector: 'lam-inbox-link',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule, RouterLink],
  template: `
    <a mat-icon-button class="inbox-link" routerLink="/inbox" [attr.aria-label]="label()" [matTooltip]="label()">
      <mat-icon aria-hidden="true">inbox</mat-icon>
      <!-- The count on the icon's shoulder (the link's label says it in words). -->
      @if (unread() > 0) {
        <span class="count" aria-hidden="true">{{ badge() }}</span>
      }
    </a>
  `,
  styles: `
    .inbox-link {
      position: relative;
      color: var(--lam-on-ink);
      --mat-focus-indicator-border-color: var(--lam-copper);
    }
    .count {
      position: absolute;
      top: 2px;
      right: 0;
      min-width: 20px;
      height: 20px;
      padding: 0 5px;
      box-sizing: border-box;
      border-radius: 10px;
      background: var(--lam-copper);
      color: #fff;
      font: var(--mat-sys-label-small);
      font-weight: 700;
      line-height: 20px;
      text-align: center;
      pointer-events: none;
    }
    @media (forced-colors: active) {
      .count {
        outline: 1px solid;
      }
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
