import { DestroyRef, Directive, ElementRef, afterNextRender, inject, signal } from '@angular/core';

/**
 * Marks a sideways-scrolling box whose content is wider than it is: the box gets shadows on the sides
 * that hide columns (classes `lam-more-left`, `lam-more-right`), and `moreLeft`/`moreRight` say so for
 * a visible hint, so a narrow window never hides a table's last columns without a word.
 */
@Directive({
  selector: '[lamScrollCue]',
  exportAs: 'scrollCue',
  host: {
    '[class.lam-more-left]': 'moreLeft()',
    '[class.lam-more-right]': 'moreRight()',
    '(scroll)': 'measure()',
  },
})
export class ScrollCue {
  private readonly element = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
  readonly moreLeft = signal(false);
  readonly moreRight = signal(false);

  constructor() {
    const destroyRef = inject(DestroyRef);
    afterNextRender(() => {
      if (typeof ResizeObserver === 'undefined') return this.measure();
      // The observer reports each box once as soon as it is laid out, then on every change: the first
      // measure waits for the browser's own layout instead of forcing one right after Angular's render
      // (with four analysis tables, that forced layout of the whole notebook cost 30-60 ms an open).
      const observer = new ResizeObserver(() => this.measure());
      observer.observe(this.element);
      const content = this.element.firstElementChild;
      if (content) observer.observe(content);
      destroyRef.onDestroy(() => observer.disconnect());
    });
  }

  /** Scrolls one view's width towards the hidden side. */
  scrollOn(direction: 1 | -1 = 1): void {
    this.element.scrollBy({ left: direction * this.element.clientWidth * 0.8, behavior: 'smooth' });
  }

  protected measure(): void {
    const { scrollLeft, scrollWidth, clientWidth } = this.element;
    this.moreLeft.set(scrollLeft > 1);
    this.moreRight.set(scrollLeft + clientWidth < scrollWidth - 1);
  }
}
