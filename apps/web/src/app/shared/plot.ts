import { NgComponentOutlet } from '@angular/common';
import {
  ApplicationRef,
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  InjectionToken,
  type Type,
  afterNextRender,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { scheduleDraw } from './plot-schedule';

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

/**
 * A map of a quantity over two parameters (a grid sweep): z[j][i] at x[i], y[j], null where it has no
 * value; drawn as coloured cells with a colour bar, under any traces.
 */
export interface PlotMap {
  readonly x: readonly number[];
  readonly y: readonly number[];
  readonly z: readonly (readonly (number | null)[])[];
  /** The quantity, with its unit, for the colour bar. */
  readonly title: string;
  readonly range?: readonly [number, number];
}

export interface PlotFigure {
  readonly traces: readonly PlotTrace[];
  readonly x: PlotAxis;
  readonly y: PlotAxis;
  readonly markers?: readonly PlotMarker[];
  readonly map?: PlotMap;
}

/** The maps' colours: Laminote's teal (low) through sand to its rust (high). */
const MAP_COLOURS = [
  [0, '#1b5e66'],
  [0.5, '#e8dcc2'],
  [1, '#b5652f'],
] as const;

/**
 * Loads the plotting library and answers the component that draws with it. A token so that component
 * tests can stand in a light renderer for the 4.7 MB library; the app loads it on first use only.
 */
export const PLOT_RENDERER = new InjectionToken<() => Promise<Type<unknown>>>('PLOT_RENDERER', {
  factory: () => loadPlotly,
});

/** What the plot's own toolbar asks of the plotting library, on the drawn plot's element. */
export interface PlotLibrary {
  downloadImage(element: HTMLElement, options: { format: 'png' | 'svg'; filename: string; width?: number; height?: number; scale?: number }): Promise<unknown>;
  relayout(element: HTMLElement, update: Record<string, unknown>): Promise<unknown>;
}

/** Loads the plotting library itself, for the toolbar's export and reset. A token for the same reason. */
export const PLOT_LIBRARY = new InjectionToken<() => Promise<PlotLibrary>>('PLOT_LIBRARY', {
  factory: () => loadLibrary,
});

let plotly: Promise<Type<unknown>> | null = null;
let library: Promise<PlotLibrary> | null = null;

function loadLibrary(): Promise<PlotLibrary> {
  // Plotly's partial bundle of the cartesian trace types (scatter and heatmap are all Laminote draws):
  // a third of the full bundle, so the long task that starts it is a third as long.
  library ??= import('plotly.js-cartesian-dist-min').then((m) => m.default as unknown as PlotLibrary);
  return library;
}

/** The drawing component once any plot loaded it (the print handler draws every other plot with it). */
let drawnComponent: Type<unknown> | null = null;

function loadPlotly(): Promise<Type<unknown>> {
  plotly ??= Promise.all([import('angular-plotly.js'), loadLibrary()]).then(([binding, lib]) => {
    binding.PlotlyService.setPlotly(lib);
    drawnComponent = binding.PlotlyComponent;
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
    // Large and small numbers as the trade writes them (2×10⁷), not the library's SI prefixes ("20M").
    exponentformat: 'power',
    gridcolor: '#e4e9eb',
    zerolinecolor: '#a7acae',
    linecolor: '#8d9193',
    mirror: true,
    showline: true,
    automargin: true,
  };
}

/** The axis settings that put a plot back to the view it was drawn with (after zooming or panning). */
export function resetViewUpdate(figure: PlotFigure): Record<string, unknown> {
  const update: Record<string, unknown> = {};
  for (const [name, axis] of [['xaxis', figure.x], ['yaxis', figure.y]] as const) {
    const layout = axisLayout(axis);
    update[`${name}.autorange`] = layout['autorange'];
    if (layout['range']) update[`${name}.range`] = layout['range'];
  }
  return update;
}

/** A file name from what the plot shows: "pressure-coefficient-cp-along-x-c". */
export function plotFileName(label: string): string {
  return (
    label
      .toLowerCase()
      .normalize('NFKD')
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'plot'
  );
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
  if (figure.map) {
    const m = figure.map;
    data.unshift({
      type: 'heatmap',
      x: m.x,
      y: m.y,
      z: m.z,
      zmin: m.range?.[0],
      zmax: m.range?.[1],
      colorscale: MAP_COLOURS,
      colorbar: { title: { text: m.title, side: 'right', font: { family: FONT, size: 11 } }, thickness: 12, tickfont: { family: MONO, size: 10 } },
      hoverongaps: false,
      hovertemplate: `${figure.x.title} %{x:.4g}<br>${figure.y.title} %{y:.4g}<br>${m.title} %{z:.3f}<extra></extra>`,
    } as unknown as (typeof data)[number]);
  }
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
      // The library's own hover toolbar is not shown: the plot has a small toolbar of Laminote's own.
      displayModeBar: false,
      displaylogo: false,
      responsive: true,
      scrollZoom: false,
      doubleClick: 'reset',
    },
  };
}

/**
 * A plot, drawn by plotly.js through angular-plotly.js. The library is fetched the first time a plot
 * comes near the screen and the page is quiet, in a chunk of its own, so the first screen never waits
 * for it and a long study does not draw plots nobody has scrolled to yet.
 */
@Component({
  selector: 'lam-plot',
  imports: [MatIconModule, MatTooltipModule, NgComponentOutlet],
  template: `
    @if (renderer(); as renderer) {
      <div class="tools" role="toolbar" [attr.aria-label]="'Plot tools: ' + label()">
        <button type="button" class="tool" (click)="exportImage('png')" matTooltip="Save the plot as a PNG image" aria-label="Export PNG">
          <mat-icon aria-hidden="true">image</mat-icon>PNG
        </button>
        <button type="button" class="tool" (click)="exportImage('svg')" matTooltip="Save the plot as an SVG drawing" aria-label="Export SVG">
          <mat-icon aria-hidden="true">draw</mat-icon>SVG
        </button>
        <button type="button" class="tool" (click)="resetView()" matTooltip="Back to the full view after zooming (drag to zoom; double-click also resets)" aria-label="Reset view">
          <mat-icon aria-hidden="true">fit_screen</mat-icon>
        </button>
      </div>
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
      position: relative;
      min-width: 0;
    }
    .tools {
      position: absolute;
      top: 2px;
      right: 4px;
      z-index: 1;
      display: flex;
      gap: 2px;
      padding: 2px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 6px;
      background: var(--mat-sys-surface);
      opacity: 0;
      transition: opacity 120ms;
    }
    :host(:hover) .tools,
    .tools:focus-within {
      opacity: 1;
    }
    .tool {
      display: inline-flex;
      align-items: center;
      gap: 2px;
      height: 22px;
      padding: 0 6px;
      border: 0;
      border-radius: 4px;
      background: none;
      color: var(--mat-sys-primary);
      font: 700 10px/1 var(--lam-mono);
      letter-spacing: 0.02em;
      cursor: pointer;
    }
    .tool:hover {
      background: var(--mat-sys-primary-container);
    }
    .tool mat-icon {
      font-size: 14px;
      width: 14px;
      height: 14px;
    }
    @media print {
      .tools {
        display: none;
      }
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
  private readonly library = inject(PLOT_LIBRARY);
  private readonly appRef = inject(ApplicationRef);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
  /** The drawing component once loaded, so a print can draw every plot at once. */
  private loaded: Type<unknown> | null = null;

  constructor() {
    const host = this.host;
    const destroyRef = inject(DestroyRef);
    afterNextRender(() => {
      // A print (or a capture in print media) shows every plot, not the placeholders of plots
      // nobody scrolled to: draw them all first.
      const drawForPrint = () => this.drawNow();
      window.addEventListener('beforeprint', drawForPrint);
      const printMedia = typeof window.matchMedia === 'function' ? window.matchMedia('print') : null;
      const onMedia = (event: MediaQueryListEvent) => event.matches && drawForPrint();
      printMedia?.addEventListener?.('change', onMedia);
      destroyRef.onDestroy(() => {
        window.removeEventListener('beforeprint', drawForPrint);
        printMedia?.removeEventListener?.('change', onMedia);
      });
      // A plot whose cell body is drawn while printing is already under way missed the change.
      // (Not drawNow: this runs inside a render, where a synchronous tick would be recursive.)
      if (printMedia?.matches) {
        this.draw();
        return;
      }

      if (typeof IntersectionObserver === 'undefined') {
        this.draw();
        return;
      }
      // Drawn once it is within half a screen's height of the viewport.
      const observer = new IntersectionObserver(
        (entries) => {
          if (entries.some((e) => e.isIntersecting)) {
            observer.disconnect();
            // The library takes a long task to start, and each plot one to draw: after the page has
            // been quiet for a moment, one plot per frame (plot-schedule.ts).
            destroyRef.onDestroy(scheduleDraw(() => this.draw()));
          }
        },
        { rootMargin: '50% 0px' },
      );
      observer.observe(host);
      destroyRef.onDestroy(() => observer.disconnect());
    });
  }

  private draw(): Promise<void> {
    return this.load()
      .then((component) => {
        this.loaded = component;
        this.renderer.set(component);
      })
      .catch((error: unknown) => this.failed.set(error instanceof Error ? error.message : String(error)));
  }

  /** Draws at once: synchronously when the library is already loaded (a print cannot wait). */
  private drawNow(): void {
    if (this.renderer()) return;
    const ready = this.loaded ?? drawnComponent;
    if (ready) {
      this.renderer.set(ready);
      this.appRef.tick();
    } else {
      this.draw();
    }
  }

  /** The element the library drew into. */
  private graph(): HTMLElement | null {
    return this.host.querySelector<HTMLElement>('.js-plotly-plot');
  }

  protected exportImage(format: 'png' | 'svg'): void {
    const graph = this.graph();
    if (!graph) return;
    const width = Math.max(480, Math.round(graph.getBoundingClientRect().width));
    void this.library().then((lib) => lib.downloadImage(graph, { format, filename: plotFileName(this.label()), width, height: this.height(), scale: format === 'png' ? 2 : 1 }));
  }

  protected resetView(): void {
    const graph = this.graph();
    if (!graph) return;
    void this.library().then((lib) => lib.relayout(graph, resetViewUpdate(this.figure())));
  }
}
