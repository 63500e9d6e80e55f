import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { splitAtStagnation } from './stagnation';
import { joukowskiLoop } from '../test/joukowski';

describe('stagnation point of an analytic closed loop (Joukowski aerofoil, exact potential flow)', () => {
  const loop = joukowskiLoop({ re: -0.08, im: 0.05 }, 4, 161);
  const split = splitAtStagnation(loop.x, loop.y, loop.speed);
  const chord = Math.max(...loop.x) - Math.min(...loop.x);

  it('finds the exact stagnation point between stations', () => {
    const spacing = Math.hypot(loop.x[80] - loop.x[81], loop.y[80] - loop.y[81]);
    const miss = Math.hypot(split.stagnation.x - loop.stagnation.x, split.stagnation.y! - loop.stagnation.y);
    expect(miss).toBeLessThan(0.1 * spacing);
    expect(miss / chord).toBeLessThan(1e-4);
  });

  it('gives the leading-edge velocity gradient within 0.5 %', () => {
    expect(Math.abs(split.stagnation.velocityGradient / loop.stagnation.velocityGradient - 1)).toBeLessThan(0.005);
  });

  it('names the sides by height and measures arc length from the stagnation point', () => {
    expect(split.upperFirst).toBe(true);
    for (const side of [split.upper, split.lower]) {
      expect(side.s[0]).toBe(0);
      expect(side.ue[0]).toBe(0);
      for (let i = 1; i < side.s.length; i++) expect(side.s[i]).toBeGreaterThan(side.s[i - 1]);
    }
    // At incidence the stagnation point lies on the lower side: the upper surface is the longer one.
    expect(split.upper.s.at(-1)!).toBeGreaterThan(split.lower.s.at(-1)!);
    // Arc lengths of both sides add up to the loop's perimeter.
    let perimeter = 0;
    for (let i = 1; i < loop.x.length; i++) perimeter += Math.hypot(loop.x[i] - loop.x[i - 1], loop.y[i] - loop.y[i - 1]);
    expect(split.upper.s.at(-1)! + split.lower.s.at(-1)!).toBeCloseTo(perimeter, 10);
  });

  it('works on the reversed loop, naming the sides the same way', () => {
    const reversed = splitAtStagnation([...loop.x].reverse(), [...loop.y].reverse(), [...loop.speed].reverse());
    expect(reversed.upperFirst).toBe(false);
    expect(reversed.stagnation.x).toBeCloseTo(split.stagnation.x, 8);
    expect(reversed.upper.s.length).toBe(split.upper.s.length);
  });

  it('runs through the engine from a pasted table', () => {
    const text = ['# Joukowski section, exact potential flow', 'x y cp', ...loop.x.map((x, i) => `${x}\t${loop.y[i]}\t${loop.cp[i]}`)].join('\n');
    const result = analyzeCase({ flow: { reynolds: 3e6 }, pressureTable: text });
    expect(result.surfaces.map((s) => s.name)).toEqual(['upper', 'lower']);
    const upper = result.surfaces[0];
    expect(upper.stations.x![0]).toBeCloseTo(split.stagnation.x, 12);
    expect(upper.stations.ue[0]).toBe(0);
    expect(upper.transition.s).not.toBeNull();
    expect(result.cd!).toBeGreaterThan(0.002);
    expect(result.cd!).toBeLessThan(0.02);
  });
});

describe('stagnation point on a station: ellipse at zero incidence (exact potential flow)', () => {
  // Ellipse x = a cos η, y = b sin η in a stream along x: q/V = (1 + b/a)|sin η| / √(sin²η + (b/a)² cos²η)
  // (Milne-Thomson, "Theoretical Hydrodynamics"), leading-edge gradient dq/ds = (a + b)/b² (closed form).
  const a = 0.5;
  const b = 0.06;
  const count = 241;
  const eta = Array.from({ length: count }, (_, i) => (2 * Math.PI * i) / (count - 1));
  const x = eta.map((e) => a * Math.cos(e) + a);
  const y = eta.map((e) => b * Math.sin(e));
  const speed = eta.map((e) => ((1 + b / a) * Math.abs(Math.sin(e))) / Math.sqrt(Math.sin(e) ** 2 + (b / a) ** 2 * Math.cos(e) ** 2));
  const split = splitAtStagnation(x, y, speed);

  it('puts the stagnation point on the leading-edge station and splits symmetrically', () => {
    expect(split.stagnation.x).toBeCloseTo(0, 12);
    expect(split.stagnation.y).toBeCloseTo(0, 12);
    expect(split.upper.s.length).toBe(split.lower.s.length);
    for (let i = 0; i < split.upper.s.length; i++) expect(split.upper.s[i]).toBeCloseTo(split.lower.s[i], 12);
    expect(split.upper.y![5]).toBeGreaterThan(0);
  });

  it('gives the leading-edge gradient (a + b)/b² within 1 %', () => {
    expect(Math.abs(split.stagnation.velocityGradient / ((a + b) / (b * b)) - 1)).toBeLessThan(0.01);
  });
});

describe('a loop mirror-symmetric about its chord to the bit (ellipse at zero incidence, exact potential flow)', () => {
  // The upper half of the ellipse x = a(1 + cos η), y = b sin η, mirrored by negating y; speed as above
  // (Milne-Thomson, "Theoretical Hydrodynamics"). Odd count: a station on the stagnation point; even
  // count: the stagnation point midway between two stations.
  const a = 0.5;
  const b = 0.06;
  const mirrored = (half: number, withNose: boolean) => {
    const eta = Array.from({ length: half }, (_, i) => (Math.PI * i) / (withNose ? half - 1 : half - 0.5));
    // The nose point goes on the chord (sin π is 1.2e-16 in doubles), so that the loop is its own mirror image.
    const upper = eta.map((e, i) => ({
      x: a * Math.cos(e) + a,
      y: withNose && i === half - 1 ? 0 : b * Math.sin(e),
      speed: ((1 + b / a) * Math.abs(Math.sin(e))) / Math.sqrt(Math.sin(e) ** 2 + (b / a) ** 2 * Math.cos(e) ** 2),
    }));
    const lower = upper.slice(0, withNose ? -1 : undefined).reverse().map((p) => ({ ...p, y: -p.y }));
    const loop = [...upper, ...lower];
    return { x: loop.map((p) => p.x), y: loop.map((p) => p.y), speed: loop.map((p) => p.speed) };
  };

  for (const [label, loop] of [
    ['a station on the stagnation point', mirrored(121, true)],
    ['the stagnation point between two stations', mirrored(120, false)],
  ] as const) {
    it(`gives the two surfaces the same stations to the bit (${label})`, () => {
      const split = splitAtStagnation(loop.x, loop.y, loop.speed);
      const { upper, lower } = split;
      expect(upper.s.length).toBe(lower.s.length);
      expect(Array.from(upper.s)).toEqual(Array.from(lower.s));
      expect(Array.from(upper.ue)).toEqual(Array.from(lower.ue));
      expect(Array.from(upper.x)).toEqual(Array.from(lower.x));
      expect(Array.from(upper.y!.subarray(1))).toEqual(Array.from(lower.y!.subarray(1), (v) => -v));
      expect(split.stagnation.y).toBeCloseTo(0, 12);
      // And so the whole analysis of the two sides, through the adaptive turbulent march.
      const text = ['x y cp', ...loop.x.map((x, i) => `${x} ${loop.y[i]} ${1 - loop.speed[i] ** 2}`)].join('\n');
      const [up, down] = analyzeCase({ flow: { reynolds: 4e6 }, criteria: ['eN', 'michel'], pressureTable: text }).surfaces;
      expect(up!.stations).toEqual(down!.stations);
      expect(up!.cd).toBe(down!.cd);
    });
  }
});
