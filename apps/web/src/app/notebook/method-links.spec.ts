import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { CellOutput } from '@laminote/contracts';
import { lazyModule } from '../shared/lazy-module';
import { METHOD_CATALOGUE, MethodLinks } from './method-links';

function output(status: 'ok' | 'error', result: unknown): CellOutput {
  return { key: 'k', status, result, error: status === 'error' ? { message: 'stopped', field: null } : null, engineVersion: '1', durationMs: 1, computedAt: '2026-12-01T00:00:00Z' } as CellOutput;
}

/** The line as drawn once the methods catalogue, loaded apart from the first screen, has come. */
async function render(kind: string, out: CellOutput | null): Promise<HTMLElement> {
  TestBed.configureTestingModule({ imports: [MethodLinks], providers: [provideRouter([])] });
  const fixture = TestBed.createComponent(MethodLinks);
  fixture.componentRef.setInput('kind', kind);
  fixture.componentRef.setInput('output', out);
  fixture.detectChanges();
  await fixture.whenStable();
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

describe('MethodLinks (the Methods line under a result)', () => {
  it('links each method of an analysis result to its methods page, by name', async () => {
    const el = await render('analysis', output('ok', { flow: { reynolds: 6e6, mach: 0, nCrit: 9 }, surfaces: [{ transition: { criteria: { eN: 0.4, granville: 0.3 } } }], attachmentLine: null }));
    const links = Array.from(el.querySelectorAll('a'));
    expect(links.map((a) => a.getAttribute('href'))).toEqual(['/methods/thwaites', '/methods/head', '/methods/squire-young', '/methods/envelope-en', '/methods/granville']);
    expect(links[0]!.textContent).toContain('Thwaites');
    expect(el.textContent).toContain('Methods');
  });

  it('shows nothing for a failed run or a kind without methods', async () => {
    expect((await render('flatPlate', output('error', null))).querySelector('.method-links')).toBeNull();
    TestBed.resetTestingModule();
    expect((await render('note', output('ok', { text: 'x' }))).querySelector('.method-links')).toBeNull();
  });

  it('keeps the line in its place, hidden, until the catalogue has come, so nothing below it moves', async () => {
    type Catalogue = typeof import('@laminote/aero/methods/result-methods');
    let arrive: ((module: Catalogue) => void) | undefined;
    const catalogue = lazyModule(() => new Promise<Catalogue>((resolve) => (arrive = resolve)));
    TestBed.configureTestingModule({ imports: [MethodLinks], providers: [provideRouter([]), { provide: METHOD_CATALOGUE, useValue: catalogue }] });
    const fixture = TestBed.createComponent(MethodLinks);
    fixture.componentRef.setInput('kind', 'flow');
    fixture.componentRef.setInput('output', output('ok', { temperature_K: 216.65 }));
    fixture.detectChanges();
    const el = fixture.nativeElement as HTMLElement;
    const kept = el.querySelector<HTMLElement>('.method-links')!;
    expect(kept.getAttribute('aria-hidden')).toBe('true');
    expect(getComputedStyle(kept).visibility).toBe('hidden');
    expect(el.querySelectorAll('a').length).toBe(0);
    // The same line as the one that comes (its label, its class), so it takes the same height in a
    // browser (this test's DOM does no layout; the benchmark's study shows the first frame keeps its height).
    expect(kept.textContent?.trim()).toBe('Methods');

    const loading = catalogue.load();
    arrive!(await import('@laminote/aero/methods/result-methods'));
    await loading;
    fixture.detectChanges();
    const line = el.querySelector<HTMLElement>('.method-links')!;
    expect(line.getAttribute('aria-hidden')).toBeNull();
    expect(Array.from(line.querySelectorAll('a')).map((a) => a.getAttribute('href'))).toEqual(['/methods/isa', '/methods/sutherland', '/methods/mack']);
    expect(line.querySelector('.method-links-label')?.textContent).toBe('Methods');
  });

  it('keeps no place for a result without methods or a failed run', () => {
    TestBed.configureTestingModule({ imports: [MethodLinks], providers: [provideRouter([]), { provide: METHOD_CATALOGUE, useValue: lazyModule(() => new Promise<never>(() => undefined)) }] });
    const fixture = TestBed.createComponent(MethodLinks);
    fixture.componentRef.setInput('kind', 'note');
    fixture.componentRef.setInput('output', output('ok', { text: 'x' }));
    fixture.detectChanges();
    expect((fixture.nativeElement as HTMLElement).querySelector('.method-links')).toBeNull();
    fixture.componentRef.setInput('kind', 'flatPlate');
    fixture.componentRef.setInput('output', output('error', null));
    fixture.detectChanges();
    expect((fixture.nativeElement as HTMLElement).querySelector('.method-links')).toBeNull();
  });
});
