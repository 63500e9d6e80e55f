import { nacaSection } from '@laminote/aero';
import { outlineFigure, splitOutline } from './section-figures';

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
