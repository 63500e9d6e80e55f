import { DOCUMENT } from '@angular/common';
import { ChangeDetectionStrategy, Component, ElementRef, ViewEncapsulation, effect, inject, input } from '@angular/core';
import katex from 'katex';

/** The KaTeX stylesheet bundle (angular.json: katex.css, not injected), linked once when a formula is first shown. */
const KATEX_STYLESHEET = 'katex.css';

function linkStylesheet(document: Document): void {
  if (document.querySelector(`link[data-lam-katex]`)) return;
  const link = document.createElement('link');
  link.rel = 'stylesheet';
  link.href = KATEX_STYLESHEET;
  link.setAttribute('data-lam-katex', '');
  document.head.appendChild(link);
}

/**
 * A formula typeset by KaTeX. The TeX comes from the engine's methods catalogue, never from a user;
 * KaTeX escapes what it prints and, untrusted by default, refuses links and raw HTML commands. The
 * KaTeX stylesheet and its fonts ship with the app as their own bundle, loaded only by pages with formulas.
 */
@Component({
  selector: 'lam-tex',
  template: '',
  styleUrl: './tex.scss',
  encapsulation: ViewEncapsulation.None,
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'lam-tex', '[class.lam-tex-display]': 'display()' },
})
export class Tex {
  readonly tex = input.required<string>();
  readonly display = input(false);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  constructor() {
    linkStylesheet(inject(DOCUMENT));
    effect(() => {
      this.host.nativeElement.innerHTML = katex.renderToString(this.tex(), { displayMode: this.display(), throwOnError: false, output: 'htmlAndMathml' });
    });
  }
}
