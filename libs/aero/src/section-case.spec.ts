import { describe, expect, it } from 'vitest';
import { computePolarPoints } from './polar';
import { bodyAt, prepareSection, sectionAt } from './section-case';
import { ShapeInputError } from './shape-input';

describe('section case: from a shape to Cp', () => {
  it('pasted coordinates and the NACA generator give the same solution', () => {
    const naca = prepareSection({ naca: '2412', panels: 160 });
    const text = `NACA 2412 as pasted\n${naca.outline.x.map((x, i) => `${x}\t${naca.outline.y[i]}`).join('\n')}`;
    const pasted = prepareSection({ coordinates: text, panels: 160 });
    const a = sectionAt(naca, { alphaDeg: 4 }, 0);
    const b = sectionAt(pasted, { alphaDeg: 4 }, 0);
    expect(b.cl).toBeCloseTo(a.cl, 2);
    expect(b.cm).toBeCloseTo(a.cm, 3);
    expect(pasted.title).toBe('NACA 2412 as pasted');
  });

  it('at Mach 0.5 the Kármán–Tsien Cp is reported, Prandtl–Glauert beside it, and the sonic Cp', () => {
    const section = prepareSection({ naca: '0012', panels: 120 });
    const low = sectionAt(section, { alphaDeg: 2 }, 0);
    const high = sectionAt(section, { alphaDeg: 2 }, 0.5);
    expect(high.cl / low.cl).toBeGreaterThan(1.1); // ≈ 1/β = 1.155 for thin sections (Glauert 1928)
    expect(high.cl / low.cl).toBeLessThan(1.25);
    expect(high.criticalCp).toBeCloseTo(-2.13, 2); // NACA Report 1135 relation at M = 0.5: Cp* = −2.1320
    expect(high.cpPrandtlGlauert).toHaveLength(high.cp.length);
    expect(high.criticalMach).toBeGreaterThan(0.6);
  });

  it('names the field and the line at fault', () => {
    expect(() => prepareSection({ naca: '2512x', panels: 160 })).toThrow(ShapeInputError);
    try {
      prepareSection({ coordinates: '1 0\n0.5 0.05\n0 0\n0.5 oops\n1 0', panels: 80 });
    } catch (error) {
      expect(error).toMatchObject({ field: 'coordinates', line: 4 });
    }
  });

  it('a body of revolution from pasted x r rows: a sphere gives Cp = 1 − 9/4 sin²θ', () => {
    const text = Array.from({ length: 41 }, (_, k) => {
      const t = Math.PI - (Math.PI * k) / 40;
      return `${1 + Math.cos(t)} ${k === 0 || k === 40 ? 0 : Math.sin(t)}`;
    }).join('\n');
    const body = bodyAt({ coordinates: text, panels: 120 });
    let worst = 0;
    body.x.forEach((x, i) => {
      const theta = Math.atan2(body.r[i], 0.5 - x);
      worst = Math.max(worst, Math.abs(body.cp[i] - (1 - 2.25 * Math.sin(theta) ** 2)));
    });
    expect(worst).toBeLessThan(0.02);
  });
});

describe('polar', () => {
  it('NACA 0012 at Re 6 million: symmetric, lift through zero, least drag at zero lift', () => {
    const section = prepareSection({ naca: '0012', panels: 160 });
    const points = computePolarPoints(section, { by: 'alpha', from: -6, to: 6, points: 7 }, { reynolds: 6e6, mach: 0, nCrit: 9 });
    const zero = points[3];
    expect(zero.cl).toBeCloseTo(0, 6);
    expect(zero.surfaces[0].transitionX).toBeCloseTo(zero.surfaces[1].transitionX!, 2);
    for (let k = 1; k < points.length; k++) expect(points[k].cl).toBeGreaterThan(points[k - 1].cl);
    expect(zero.cd!).toBeLessThan(points[0].cd!);
    expect(zero.cd!).toBeLessThan(points[6].cd!);
    // I. H. Abbott and A. E. von Doenhoff, "Theory of Wing Sections", 1959, Appendix IV (from memory):
    // NACA 0012, smooth, Re 6 × 10⁶, cd ≈ 0.0055 at zero lift.
    expect(zero.cd!).toBeGreaterThan(0.004);
    expect(zero.cd!).toBeLessThan(0.0075);
    // Transition moves forward on the upper surface as the incidence rises.
    expect(points[6].surfaces.find((s) => s.name === 'upper')!.transitionX!).toBeLessThan(zero.surfaces.find((s) => s.name === 'upper')!.transitionX!);
  });
});

describe('engine case with a section or a body', () => {
  it('analyses a NACA section at a target lift and returns its inviscid solution', async () => {
    const { analyzeCase } = await import('./analyze');
    const result = analyzeCase({ flow: { reynolds: 6e6, mach: 0.3, nCrit: 9 }, section: { naca: '2412', cl: 0.5, panels: 160 } });
    expect(result.inviscid?.kind).toBe('section');
    if (result.inviscid?.kind !== 'section') return;
    expect(result.inviscid.cl).toBeCloseTo(0.5, 6);
    expect(result.inviscid.criticalCp).toBeLessThan(-5);
    expect(result.surfaces.map((s) => s.name)).toEqual(['upper', 'lower']);
    expect(result.cd).toBeGreaterThan(0.004);
  });

  it('analyses a body of revolution along its meridian with the Mangler transformation', async () => {
    const { analyzeCase } = await import('./analyze');
    // A 6:1 ellipsoid of revolution, invented for the check.
    const text = Array.from({ length: 81 }, (_, k) => {
      const t = Math.PI - (Math.PI * k) / 80;
      return `${3 + 3 * Math.cos(t)} ${k === 0 || k === 80 ? 0 : 0.5 * Math.sin(t)}`;
    }).join('\n');
    const result = analyzeCase({ flow: { reynolds: 2e7, mach: 0, nCrit: 9 }, body: { coordinates: text } });
    expect(result.inviscid?.kind).toBe('body');
    expect(result.surfaces[0].name).toBe('body');
    expect(result.surfaces[0].transition.s).not.toBeNull();
  });

  it('names the field and line of bad shape input', async () => {
    const { analyzeCase, CaseError } = await import('./analyze');
    expect(() => analyzeCase({ flow: { reynolds: 1e6 }, section: { naca: '9999x', alphaDeg: 2 } })).toThrow(CaseError);
    try {
      analyzeCase({ flow: { reynolds: 1e6 }, body: { coordinates: '0 0\n0.2 0.1\n0.4 x\n0.6 0.1\n1 0' } });
    } catch (error) {
      expect((error as InstanceType<typeof CaseError>).field).toBe('body.coordinates line 3');
    }
    expect(() => analyzeCase({ flow: { reynolds: 1e6 }, section: { naca: '0012' } })).toThrow(/alphaDeg/);
    expect(() => analyzeCase({ flow: { reynolds: 1e6 }, section: { naca: '0012', alphaDeg: 1 }, pressureTable: '1 0 0' })).toThrow(/not/);
  });
});
