import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { CellOutput } from '@laminote/contracts';
import { MethodLinks } from './method-links';

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
});
