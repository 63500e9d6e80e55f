import { DOCUMENT, Injectable, inject } from '@angular/core';

/**
 * Full-page navigation away from the app (to the sign-in flow or the provider's sign-out page).
 * A service of its own so that tests can observe where the app would go without leaving the page.
 */
@Injectable({ providedIn: 'root' })
export class PageNavigation {
  private readonly document = inject(DOCUMENT);

  assign(url: string): void {
    this.document.location.assign(url);
  }
}
