import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { laminarMeanCf } from './flat-plate';
import { turbulentPlate } from './validation/turbulent';
import { entrainmentShapeFactor, shapeFactorFromEntrainment } from './head';
import { analyzeOne, nearest, relative, stations } from '../test/cases';


// Head's method against Prandtl's and Schlichting's friction laws and the momentum balance of a plate are
// shared reference cases (./validation/turbulent.ts), run by the validation page too.
describe('Head’s method on a turbulent flat plate', () => {
  it('falls roughly as Re^−0.2 and is several times the laminar value (common observation)', () => {
    const cf6 = turbulentPlate(1e6).cdFriction!;
    const cf8 = turbulentPlate(1e8).cdFriction!;
    const exponent = Math.log(cf8 / cf6) / Math.log(100);
    expect(exponent).toBeGreaterThan(-0.25);
    expect(exponent).toBeLessThan(-0.13);
    expect(cf6 / laminarMeanCf(1e6)).toBeGreaterThan(3);
    expect(turbulentPlate(1e7).cdFriction! / laminarMeanCf(1e7)).toBeGreaterThan(6);
  });

  it('has a flat-plate shape factor near 1.3 to 1.4 (common practice)', () => {
    const plate = turbulentPlate(1e7);
    const h = plate.stations.H[nearest(plate.stations.s, 0.8)]!;
    expect(h).toBeGreaterThan(1.28);
    expect(h).toBeLessThan(1.45);
  });
});

describe('turbulent march details', () => {
  it('H1(H) and its inverse agree on both branches', () => {
    for (const h of [1.2, 1.4, 1.6, 1.8, 2.4]) expect(shapeFactorFromEntrainment(entrainmentShapeFactor(h))).toBeCloseTo(h, 10);
  });

  it('starts from the laminar momentum thickness at transition', () => {
    const s = stations(2001, 0, 1, 1);
    const { surface } = analyzeOne({ flow: { reynolds: 4e6 }, criteria: [], surfaces: [{ name: 'plate', s, ue: s.map(() => 1), trip: 0.4 }] });
    const i = s.findIndex((x) => x > 0.4);
    const laminarTheta = Math.sqrt((0.45 * 0.4) / 4e6);
    expect(Math.abs(relative(surface.stations.theta[i]!, laminarTheta))).toBeLessThan(0.01);
    expect(surface.stations.H[i - 1]!).toBeCloseTo(2.61, 2);
    expect(surface.stations.H[i]!).toBeLessThan(1.45);
  });

  it('reports turbulent separation in a strong adverse gradient, stops there and warns', () => {
    const s = stations(301, 0, 1, 1);
    const ue = s.map((x) => (x < 0.3 ? 1 + 0.3 * x : 1.09 - 0.8 * (x - 0.3)));
    const { surface, result } = analyzeOne({ flow: { reynolds: 3e6 }, surfaces: [{ name: 'upper', s, ue, trip: 0.05 }] });
    const separation = surface.turbulentSeparation!.s;
    expect(separation).toBeGreaterThan(0.3);
    expect(separation).toBeLessThan(1);
    const after = s.findIndex((x) => x > separation);
    expect(surface.stations.theta[after]).toBeNull();
    expect(surface.stations.H[after - 1]!).toBeLessThan(2.4);
    expect(surface.stations.H[after - 1]!).toBeGreaterThan(1.8);
    expect(result.warnings.some((w) => w.includes('turbulent separation'))).toBe(true);
    expect(surface.cd).not.toBeNull();
  });

  it('keeps the layer attached in a mild adverse gradient', () => {
    const s = stations(301, 0, 1, 1);
    const { surface } = analyzeOne({ flow: { reynolds: 3e6 }, surfaces: [{ name: 'upper', s, ue: s.map((x) => 1.1 - 0.15 * x), trip: 0.05 }] });
    expect(surface.turbulentSeparation).toBeNull();
    expect(surface.stations.theta.at(-1)).not.toBeNull();
  });

  it('can be switched off: no turbulent values and no drag after transition', () => {
    const s = stations(101);
    const result = analyzeCase({ flow: { reynolds: 3e6 }, turbulent: false, surfaces: [{ name: 'upper', s, ue: s.map(() => 1), trip: 0.5 }] });
    const surface = result.surfaces[0];
    expect(surface.stations.theta.at(-1)).toBeNull();
    expect(surface.cd).toBeNull();
    expect(result.cd).toBeNull();
  });
});

describe('transition at the last station', () => {
  it('keeps the laminar trailing-edge state for the drag', () => {
    const s = stations(101);
    const ue = s.map(() => 1);
    const laminar = analyzeOne({ flow: { reynolds: 1e6 }, criteria: [], surfaces: [{ name: 'w', s, ue }] }).surface;
    const tripped = analyzeOne({ flow: { reynolds: 1e6 }, criteria: [], surfaces: [{ name: 'w', s, ue, trip: 1 }] }).surface;
    expect(tripped.transition.by).toBe('trip');
    expect(tripped.cd).toBe(laminar.cd);
    expect(tripped.stations.H.at(-1)).toBeCloseTo(2.61, 6);
  });
});
