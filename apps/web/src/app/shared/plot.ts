import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, InjectionToken, type Type, afterNextRender, computed, inject, input, signal } from '@angular/core';

/** One line or set of markers on a plot. `y` may hold nulls where a quantity is undefined. */
export interface PlotTrace {
  readonly x: readonly number[];
  readonly y: readonly (number | null)[];
  readonly name: string;
  readonly mode?: 'lines' | 'markers' | 'lines+markers';
  readonly color?: string;
  readonly dash?: 'solid' | 'dot' | 'dash' | 'dashdot';
  readonly width?: number;
  readonly markerSize?: number;
  readonly markerSymbol?: string;
  readonly showInLegend?: boolean;
  /** Hover text per point (e.g. the table line a point came from). */
  readonly text?: readonly string[];
}

export interface PlotAxis {
  /** Always with the unit or "–" for a ratio, e.g. "x/c", "Cp", "c_f". */
  readonly title: string;
  /** Draw the axis upside down (Cp: negative values up). */
  readonly reversed?: boolean;
  readonly log?: boolean;
  readonly range?: readonly [number, number];
}

/** A vertical line at x (a transition location) or a horizontal one at y (N_crit), labelled. */
export interface PlotMarker {
  readonly at: number;
  readonly axis: 'x' | 'y';
  readonly label: string;
  readonly color?: string;
  readonly dash?: 'solid' | 'dot' | 'dash';
}

export interface PlotFigure {
  readonly traces: readonly PlotTrace[];
  readonly x: PlotAxis;
  readonly y: PlotAxis;
  readonly markers?: readonly PlotMarker[];
}

/**
 * Loads the plotting library and answers the component that draws with it. A token so that component
 * tests can stand in a light renderer for the 4.7 MB library; the app loads it on first use only.
 */
export const PLOT_RENDERER = new InjectionToken<() => Promise<Type<unknown>>>('PLOT_RENDERER', {
  factory: () => loadPlotly,
});

let plotly: Promise<Type<unknown>> | null = null;

function loadPlotly(): Promise<Type<unknown>> {
  plotly ??= Promise.all([import('angular-plotly.js'), import('plotly.js-dist-min')]).then(([binding, library]) => {
    binding.PlotlyService.setPlotly(library.default);
    return binding.PlotlyComponent;
  });
  return plotly;
}

/** The series colours of Laminote's plots: ink teal, copper, slate, moss. */
export const PLOT_COLOURS = ['#1b5e66', '#b5652f', '#5f6c7b', '#6f7d2c'] as const;

const FONT = 'Lato, system-ui, sans-serif';
const MONO = 'JetBrains Mono, ui-monospace, monospace';

function axisLayout(axis: PlotAxis): Record<string, unknown> {
  return {
    title: { text: axis.title, font: { family: FONT, size: 12 }, standoff: 6 },
    type: axis.log ? 'log' : 'linear',
    autorange: axis.range ? false : axis.reversed ? 'reversed' : true,
    range: axis.range ? (axis.reversed ? [axis.range[1], axis.range[0]] : [...axis.range]) : undefined,
    tickfont: { family: MONO, size: 10 },
    gridcolor: '#e4e9eb',
    zerolinecolor: '#a7acae',
    linecolor: '#8d9193',
    mirror: true,
    showline: true,
    automargin: true,
  };
}

/** The library's figure for a Laminote plot: its fonts, colours and compact margins. */
export function plotlyFigure(figure: PlotFigure, height: number): { data: unknown[]; layout: Record<string, unknown>; config: Record<string, unknown> } {
  const data = figure.traces.map((trace, i) => ({
    type: 'scatter',
    x: trace.x,
    y: trace.y,
    name: trace.name,
    mode: trace.mode ?? 'lines',
    connectgaps: false,
    line: { color: trace.color ?? PLOT_COLOURS[i % PLOT_COLOURS.length], dash: trace.dash ?? 'solid', width: trace.width ?? 1.75 },
    marker: { color: trace.color ?? PLOT_COLOURS[i % PLOT_COLOURS.length], size: trace.markerSize ?? 5, symbol: trace.markerSymbol ?? 'circle' },
    showlegend: trace.showInLegend ?? true,
    text: trace.text,
    hovertemplate: `${trace.name}<br>${figure.x.title} %{x:.4g}<br>${figure.y.title} %{y:.4g}${trace.text ? '<br>%{text}' : ''}<extra></extra>`,
  }));
  const markers = figure.markers ?? [];
  const shapes = markers.map((m) => ({
    type: 'line',
    xref: m.axis === 'x' ? 'x' : 'paper',
    yref: m.axis === 'x' ? 'paper' : 'y',
    x0: m.axis === 'x' ? m.at : 0,
    x1: m.axis === 'x' ? m.at : 1,
    y0: m.axis === 'x' ? 0 : m.at,
    y1: m.axis === 'x' ? 1 : m.at,
    line: { color: m.color ?? '#b5652f', width: 1.25, dash: m.dash ?? 'dash' },
  }));
  const annotations = markers.map((m, i) => ({
    xref: m.axis === 'x' ? 'x' : 'paper',
    yref: m.axis === 'x' ? 'paper' : 'y',
    x: m.axis === 'x' ? m.at : 1,
    y: m.axis === 'x' ? 1 - 0.09 * (i % 3) : m.at,
    xanchor: m.axis === 'x' ? 'left' : 'right',
    yanchor: m.axis === 'x' ? 'top' : 'bottom',
    text: m.label,
    showarrow: false,
    font: { family: FONT, size: 10, color: m.color ?? '#934b16' },
    bgcolor: 'rgba(255,255,255,0.8)',
  }));
  return {
    data,
    layout: {
      height,
      autosize: true,
      margin: { l: 56, r: 12, t: 28, b: 44 },
      paper_bgcolor: 'rgba(0,0,0,0)',
      plot_bgcolor: '#ffffff',
      font: { family: FONT, size: 12, color: '#171c1e' },
      legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', font: { size: 11 } },
      hoverlabel: { font: { family: MONO, size: 11 } },
      xaxis: axisLayout(figure.x),
      yaxis: axisLayout(figure.y),
      shapes,
      annotations,
    },
    config: {
      displaylogo: false,
      responsive: true,
      scrollZoom: false,
      modeBarButtonsToRemove: ['select2d', 'lasso2d', 'autoScale2d', 'toggleSpikelines'],
      toImageButtonOptions: { format: 'svg' },
    },
  };
}

/**
 * A plot, drawn by plotly.js through angular-plotly.js. The library is fetched the first time a plot
 * comes near the screen, in a chunk of its own, so the first screen never waits for it and a long
 * study does not draw plots nobody has scrolled to yet.
 */
@Component({
  selector: 'lam-plot',
  imports: [NgComponentOutlet],
  template: `
    @if (renderer(); as renderer) {
      <ng-container *ngComponentOutlet="renderer; inputs: plotInputs()" />
    } @else if (failed()) {
      <p class="placeholder" role="alert">The plot could not be drawn: {{ failed() }}</p>
    } @else {
      <p class="placeholder" [style.height.px]="height()">Plot is drawn when it comes into view…</p>
    }
  `,
  styles: `
    :host {
      display: block;
      min-width: 0;
    }
    .placeholder {
      display: flex;
      align-items: center;
      justify-content: center;
      margin: 0;
      border: 1px dashed var(--mat-sys-outline-variant);
      border-radius: 6px;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-small);
    }
  `,
  host: { role: 'figure', '[attr.aria-label]': 'label()' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Plot {
  readonly figure = input.required<PlotFigure>();
  /** What the plot shows, for people who cannot see it. */
  readonly label = input.required<string>();
  readonly height = input(280);

  protected readonly renderer = signal<Type<unknown> | null>(null);
  protected readonly failed = signal<string | null>(null);

  protected readonly plotInputs = computed(() => {
    const { data, layout, config } = plotlyFigure(this.figure(), this.height());
    return { data, layout, config, useResizeHandler: true, style: { width: '100%', height: `${this.height()}px` } };
  });

  private readonly load = inject(PLOT_RENDERER);

  constructor() {
    const host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
    const destroyRef = inject(DestroyRef);
    afterNextRender(() => {
      if (typeof IntersectionObserver === 'undefined') {
        this.draw();
        return;
      }
      // Drawn once it is within half a screen's height of the viewport.
      const observer = new IntersectionObserver(
        (entries) => {
          if (entries.some((e) => e.isIntersecting)) {
            observer.disconnect();
            // The library takes a long task to start: leave the first moments to the person's input.
            if (typeof requestIdleCallback === 'function') requestIdleCallback(() => this.draw(), { timeout: 2000 });
            else this.draw();
          }
        },
        { rootMargin: '50% 0px' },
      );
      observer.observe(host);
      destroyRef.onDestroy(() => observer.disconnect());
    });
  }

  private draw(): void {
    this.load()
      .then((component) => this.renderer.set(component))
      .catch((error: unknown) => this.failed.set(error instanceof Error ? error.message : String(error)));
  }
}
