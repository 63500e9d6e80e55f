import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { CellOutput } from '@laminote/contracts';
import { lazyModule } from '../shared/lazy-module';
import { METHOD_CATALOGUE, MethodLinks } from './method-links';

function output(status: 'ok' | 'error', result: unknown): CellOutput {
  return { key: 'k', status, result, error: status === 'error' ? { message: 'stopped', field: null } : null, engineVersion: '1', durationMs: 1, computedAt: '2026-12-01T00:00:00Z' } as CellOutput;
}

/**
 * The line as drawn once the methods catalogue, loaded apart from the first screen, has come (loaded
 * here first, so the test does not wait on the browser's idle callbacks, which other specs stub).
 */
async function render(kind: string, out: CellOutput | null): Promise<HTMLElement> {
  const catalogue = lazyModule(() => import('@laminote/aero/methods/result-methods'));
  await catalogue.load();
  TestBed.configureTestingModule({ imports: [MethodLinks], providers: [provideRouter([]), { provide: METHOD_CATALOGUE, useValue: catalogue }] });
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

  it('draws the links with the result, before the catalogue has come, which only adds their purposes', async () => {
    type Catalogue = typeof import('@laminote/aero/methods/result-methods');
    let arrive: ((module: Catalogue) => void) | undefined;
    const catalogue = lazyModule(() => new Promise<Catalogue>((resolve) => (arrive = resolve)));
    TestBed.configureTestingModule({ imports: [MethodLinks], providers: [provideRouter([]), { provide: METHOD_CATALOGUE, useValue: catalogue }] });
    const fixture = TestBed.createComponent(MethodLinks);
    fixture.componentRef.setInput('kind', 'analysis');
    // A swept-wing analysis lists a dozen methods, on several lines: the line is as long from the first drawing.
    const swept = { flow: { reynolds: 2e7, mach: 0.7, nCrit: 9 }, surfaces: [{ transition: { criteria: { eN: 0.4, crossflow: 0.1, crossflowC1: 0.2, michel: 0.3, hRx: 0.3, granville: 0.3 } } }], attachmentLine: { reBar: 180 } };
    fixture.componentRef.setInput('output', output('ok', swept));
    fixture.detectChanges();
    const el = fixture.nativeElement as HTMLElement;
    const links = () => Array.from(el.querySelectorAll('a'));
    const before = links().map((a) => [a.getAttribute('href'), a.textContent]);
    expect(before).toHaveLength(13);
    expect(before[0]).toEqual(['/methods/thwaites', 'Thwaites’ laminar method']);
    expect(links().every((a) => a.getAttribute('title') === null)).toBe(true);

    const loading = catalogue.load();
    const module = await import('@laminote/aero/methods/result-methods');
    arrive!(module);
    await loading;
    fixture.detectChanges();
    // The same links, names and order as the catalogue gives (what the report prints), now with their purposes.
    expect(links().map((a) => [a.getAttribute('href'), a.textContent])).toEqual(before);
    expect(links().map((a) => a.textContent)).toEqual(module.resultMethods('analysis', swept).map((m) => m.name));
    expect(links().map((a) => a.getAttribute('title'))).toEqual(module.resultMethods('analysis', swept).map((m) => m.purpose));
    expect(el.querySelector('.method-links-label')?.textContent).toBe('Methods');
  });

  it('draws no line for a result without methods or a failed run, before the catalogue too', () => {
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
