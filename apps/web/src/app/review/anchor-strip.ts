import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, input, output } from '@angular/core';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { Thread } from '@laminote/contracts';

interface Pin {
  readonly threadId: string;
  readonly x: number;
  readonly resolved: boolean;
  readonly label: string;
}

/**
 * Where a cell's comments point on its plot: per surface, a chord line from x/c 0 to 1 with a pin for
 * each anchored thread (hollow when resolved). A pin brings its thread into view.
 */
@Component({
  selector: 'lam-anchor-strip',
  imports: [MatTooltipModule],
  template: `
    @if (surfaces().length) {
      <div class="strip" role="group" aria-label="Places on the plot that comments point at">
        @for (surface of surfaces(); track surface.name) {
          <div class="row">
            <span class="surface">{{ surface.name }}</span>
            <div class="track">
              <span class="tick start lam-mono" aria-hidden="true">0</span>
              <span class="tick end lam-mono" aria-hidden="true">1</span>
              @for (pin of surface.pins; track pin.threadId) {
                <button
                  type="button"
                  class="pin"
                  [class.resolved]="pin.resolved"
                  [style.left.%]="pin.x * 100"
                  [matTooltip]="pin.label"
                  [attr.aria-label]="pin.label"
                  (click)="show(pin.threadId)"
                ></button>
              }
            </div>
          </div>
        }
        <span class="axis lam-mono" aria-hidden="true">x/c</span>
      </div>
    }
  `,
  styleUrl: './anchor-strip.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AnchorStrip {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  readonly threads = input.required<readonly Thread[]>();
  /** A pin was chosen (the thread is brought into view if it is on screen). */
  readonly picked = output<string>();

  protected readonly surfaces = computed(() => {
    const bySurface = new Map<string, Pin[]>();
    for (const t of this.threads()) {
      if (!t.anchor) continue;
      const pins = bySurface.get(t.anchor.surface) ?? [];
      const first = t.comments[0]?.body ?? '';
      pins.push({
        threadId: t.id,
        x: Math.min(1, Math.max(0, t.anchor.x)),
        resolved: t.resolved,
        label: `x/c ${t.anchor.x.toFixed(3)} on ${t.anchor.surface}${t.resolved ? ' (resolved)' : ''}: ${first.length > 60 ? `${first.slice(0, 59)}…` : first}`,
      });
      bySurface.set(t.anchor.surface, pins);
    }
    return [...bySurface].map(([name, pins]) => ({ name, pins }));
  });

  protected show(threadId: string): void {
    this.picked.emit(threadId);
    const panel = this.host.nativeElement.parentElement;
    const thread = panel?.querySelector<HTMLElement>(`[data-thread-id="${threadId}"]`);
    thread?.scrollIntoView({ block: 'nearest' });
    thread?.querySelector<HTMLElement>('button, textarea')?.focus();
  }
}
