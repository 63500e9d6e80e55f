import { Component, input } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentHarness } from '@angular/cdk/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { provideTestApp } from '../../testing/test-app';
import { PLOT_LIBRARY, PLOT_RENDERER, Plot, type PlotFigure, type PlotLibrary, plotlyFigure } from './plot';

/** Stands in for the library's drawing component: the element it would draw into. */
@Component({ selector: 'lam-fake-plotly', template: `<div class="js-plotly-plot"></div>` })
class FakePlotly {
  readonly data = input<unknown>();
  readonly layout = input<unknown>();
  readonly config = input<unknown>();
  readonly useResizeHandler = input<unknown>();
  readonly style = input<unknown>();
}

class PlotHarness extends ComponentHarness {
  static hostSelector = 'lam-plot';
  private readonly tools = this.locatorForAll('.tools button');

  async getTools(): Promise<string[]> {
    return Promise.all((await this.tools()).map(async (b) => (await b.getAttribute('aria-label')) ?? ''));
  }

  async use(label: string): Promise<void> {
    for (const b of await this.tools()) if ((await b.getAttribute('aria-label')) === label) return b.click();
    throw new Error(`no tool ${label}`);
  }
}

const FIGURE: PlotFigure = {
  traces: [{ x: [0, 0.5, 1], y: [-0.6, -0.3, 0.1], name: 'upper' }],
  x: { title: 'x/c', range: [0, 1] },
  y: { title: 'Cp', reversed: true },
};

describe('Plot', () => {
  const calls: { what: string; args: unknown[] }[] = [];

  beforeEach(() => {
    calls.length = 0;
    const library: PlotLibrary = {
      downloadImage: (...args) => Promise.resolve(calls.push({ what: 'downloadImage', args })),
      relayout: (...args) => Promise.resolve(calls.push({ what: 'relayout', args })),
    };
    TestBed.configureTestingModule({
      providers: [
        ...provideTestApp(),
        { provide: PLOT_RENDERER, useValue: () => Promise.resolve(FakePlotly) },
        { provide: PLOT_LIBRARY, useValue: () => Promise.resolve(library) },
      ],
    });
  });

  async function render() {
    const fixture = TestBed.createComponent(Plot);
    fixture.componentRef.setInput('figure', FIGURE);
    fixture.componentRef.setInput('label', 'Pressure coefficient Cp along x/c');
    fixture.detectChanges();
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 0));
    fixture.detectChanges();
    return { fixture, plot: await TestbedHarnessEnvironment.harnessForFixture(fixture, PlotHarness) };
  }

  it('hides the charting library’s own toolbar', () => {
    expect(plotlyFigure(FIGURE, 280).config['displayModeBar']).toBe(false);
  });

  it('writes large and small tick values as powers of ten, not with the library’s SI prefixes (20M)', () => {
    const { layout } = plotlyFigure({ ...FIGURE, x: { title: 'Reynolds number', log: true } }, 280);
    expect(layout['xaxis']).toMatchObject({ type: 'log', exponentformat: 'power' });
    expect(layout['yaxis']).toMatchObject({ exponentformat: 'power' });
  });

  it('offers a toolbar of its own: export PNG or SVG, and reset the view to the axes it was drawn with', async () => {
    const { plot, fixture } = await render();
    expect(await plot.getTools()).toEqual(['Export PNG', 'Export SVG', 'Reset view']);
    const graph = (fixture.nativeElement as HTMLElement).querySelector('.js-plotly-plot');

    await plot.use('Export SVG');
    await plot.use('Export PNG');
    await plot.use('Reset view');
    await new Promise((r) => setTimeout(r, 0));
    expect(calls.map((c) => [c.what, c.args[0] === graph])).toEqual([
      ['downloadImage', true],
      ['downloadImage', true],
      ['relayout', true],
    ]);
    expect(calls[0]!.args[1]).toMatchObject({ format: 'svg', filename: 'pressure-coefficient-cp-along-x-c' });
    expect(calls[1]!.args[1]).toMatchObject({ format: 'png', filename: 'pressure-coefficient-cp-along-x-c' });
    // x back to its fixed 0..1, Cp back to autorange upside down (negative values up).
    expect(calls[2]!.args[1]).toEqual({ 'xaxis.autorange': false, 'xaxis.range': [0, 1], 'yaxis.autorange': 'reversed' });
  });

  describe('away from the screen', () => {
    const saved = { observer: window.IntersectionObserver, matchMedia: window.matchMedia };
    /** A plot far below the screen: the observer never reports it in view. */
    class NeverInView {
      observe(): void {}
      disconnect(): void {}
    }
    const printing = (matches: boolean) =>
      ((query: string) => ({ matches: matches && query === 'print', media: query, addEventListener() {}, removeEventListener() {}, addListener() {}, removeListener() {} })) as unknown as typeof window.matchMedia;

    afterEach(() => {
      window.IntersectionObserver = saved.observer;
      window.matchMedia = saved.matchMedia;
    });

    it('waits until it comes into view to draw', async () => {
      window.IntersectionObserver = NeverInView as unknown as typeof IntersectionObserver;
      window.matchMedia = printing(false);
      const { fixture } = await render();
      const element = fixture.nativeElement as HTMLElement;
      expect(element.querySelector('.js-plotly-plot')).toBeNull();
      expect(element.querySelector('.placeholder')?.textContent).toContain('Plot is drawn when it comes into view');
    });

    it('draws at once when it appears while the page is already printing (a cell body drawn late)', async () => {
      window.IntersectionObserver = NeverInView as unknown as typeof IntersectionObserver;
      window.matchMedia = printing(true);
      const { fixture } = await render();
      const element = fixture.nativeElement as HTMLElement;
      expect(element.querySelector('.js-plotly-plot')).not.toBeNull();
      expect(element.querySelector('.placeholder')).toBeNull();
    });
  });
});
