import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { provideTestApp } from '../../testing/test-app';
import { cell } from '../../testing/notebook-fixtures';
import { DraftSession } from '../shared/draft-session';
import { CELL_BODIES, type LoadedBody } from './cell-bodies';
import { CellBody } from './cell-body';

const LEADING_EDGE_ID = '11111111-2222-4333-8444-555555555509';

describe('CellBody', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [...provideTestApp(), DraftSession] });
  });
  afterEach(() => vi.restoreAllMocks());

  function render(kind: Parameters<typeof cell>[0]) {
    const fixture = TestBed.createComponent(CellBody);
    fixture.componentRef.setInput('cell', cell(kind, LEADING_EDGE_ID, { title: 'Nose' }));
    fixture.detectChanges();
    return fixture;
  }

  it('draws a kind that comes with the page in its first pass', () => {
    const fixture = render('flow');
    expect((fixture.nativeElement as HTMLElement).querySelector('lam-flow-cell')).not.toBeNull();
  });

  it('says it is drawing while a kind fetched on first use arrives, then draws it', async () => {
    const fixture = render('leadingEdge');
    const host = fixture.nativeElement as HTMLElement;
    expect(host.querySelector('.body-pending')?.textContent).toContain('Drawing');
    await fixture.whenStable();
    expect(host.querySelector('lam-leading-edge-cell')).not.toBeNull();
    expect(host.querySelector('.body-pending')).toBeNull();
  });

  it('says so when the code of a kind does not load', async () => {
    vi.spyOn(CELL_BODIES.leadingEdge as LoadedBody, 'load').mockRejectedValue(new TypeError('Failed to fetch dynamically imported module'));
    const fixture = render('leadingEdge');
    await fixture.whenStable();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('This cell could not be drawn: its code did not load. Reload the page to try again.');
  });
});
