import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterLink, RouterOutlet } from '@angular/router';
import { Auth } from './core/auth';
import { Notifier } from './core/notifier';
import { InboxLink } from './inbox/inbox-link';

/** The shell: a compact top bar with the product and the signed-in person, and the page below it. */
@Component({
  selector: 'lam-root',
  imports: [InboxLink, MatButtonModule, MatDividerModule, MatIconModule, MatMenuModule, MatToolbarModule, RouterLink, RouterOutlet],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  private readonly auth = inject(Auth);
  private readonly notifier = inject(Notifier);

  protected readonly me = this.auth.me;
  protected readonly signingOut = signal(false);

  protected async signOut(): Promise<void> {
    this.signingOut.set(true);
    try {
      await this.auth.signOut();
    } catch (error) {
      this.notifier.problem(error);
      this.signingOut.set(false);
    }
  }
}
