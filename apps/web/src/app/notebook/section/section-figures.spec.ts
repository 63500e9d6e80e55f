import { computeCell, nacaSection } from '@laminote/aero';
import { CELL_SCHEMAS, TRANSITION_CRITERIA, type EngineResult } from '@laminote/contracts';
import { summarise } from '../../shared/analysis-summary';
import { analysisOutlineFigure, outlineFigure, splitOutline } from './section-figures';

describe('section figures', () => {
  const naca = nacaSection('2412', 40);

  it('splits the loop at its foremost point, both surfaces running aft from the nose', () => {
    const { upper, lower } = splitOutline(naca.x, naca.y);
    expect(upper.x[0]).toBe(Math.min(...naca.x));
    expect(upper.x.at(-1)).toBeCloseTo(1, 3);
    expect(lower.x.at(-1)).toBeCloseTo(1, 3);
    // NACA 2412 at 30 % chord: the upper surface lies above the lower.
    const at = (s: { x: number[]; y: number[] }) => s.y[s.x.findIndex((v) => v >= 0.3)]!;
    expect(at(upper)).toBeGreaterThan(at(lower));
  });

  it('puts a transition mark on the surface it belongs to', () => {
    const figure = outlineFigure(naca, [
      { surface: 'upper', x: 0.4, kind: 'transition', label: 'upper' },
      { surface: 'lower', x: 0.6, kind: 'transition', label: 'lower' },
    ]);
    const marks = figure.traces.find((t) => t.name === 'Transition (governing)')!;
    expect(marks.x).toEqual([0.4, 0.6]);
    expect(marks.y[0]!).toBeGreaterThan(0.05);
    expect(marks.y[1]!).toBeLessThan(0);
  });
});

describe('the outline of an analysis that names a section cell', () => {
  const ID = '00000000-0000-4000-8000-000000000001';
  const ID2 = '00000000-0000-4000-8000-000000000002';
  const flow = { kind: 'flow' as const, inputs: CELL_SCHEMAS.flow.inputs.parse({ mode: 'reynolds', reynolds: 6e6, mach: 0, nCrit: 9 }), upstream: {} };
  const section = { kind: 'section' as const, inputs: CELL_SCHEMAS.section.inputs.parse({ naca: '2412', alphaDeg: 2 }), upstream: {} };
  const analysis = CELL_SCHEMAS.analysis.inputs.parse({ flowCellId: ID, pressureCellId: ID2 });
  const result = computeCell('analysis', analysis, { flowCellId: flow, pressureCellId: section }) as EngineResult;

  it('marks the governing transition of each surface on that surface, at the x/c the summary table gives', () => {
    const figure = analysisOutlineFigure(result, TRANSITION_CRITERIA)!;
    const summary = summarise(result, TRANSITION_CRITERIA);
    const governing = figure.traces.find((t) => t.name === 'Transition (governing)')!;
    const upper = summary.find((s) => s.name === 'upper')!.governing!;
    const lower = summary.find((s) => s.name === 'lower')!.governing!;
    expect(governing.x).toEqual([upper.value, lower.value]);
    // Positive incidence on a cambered section: the upper surface's mark lies above the chord, the lower's below.
    expect(governing.y[0]!).toBeGreaterThan(0);
    expect(governing.y[1]!).toBeLessThan(0);
    // Each criterion that found transition away from the governing one has its own tick.
    const others = figure.traces.find((t) => t.name === 'Other criteria');
    const located = summary.flatMap((s) => TRANSITION_CRITERIA.filter((id) => s.criteria[id] && Math.abs(s.criteria[id]!.value - s.governing!.value) > 1e-9));
    expect(others?.x.length ?? 0).toBe(located.length);
  });

  it('draws nothing for an analysis of a pasted pressure table (no shape to mark)', () => {
    expect(analysisOutlineFigure({ ...result, inviscid: undefined }, TRANSITION_CRITERIA)).toBeNull();
  });
});
