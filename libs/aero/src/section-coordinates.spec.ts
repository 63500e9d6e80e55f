import { describe, expect, it } from 'vitest';
import { nacaSection } from './naca-sections';
import { normalizeSection, parseSectionCoordinates } from './section-coordinates';
import { repanelSection, sectionGeometry } from './section-geometry';

const loopText = (x: number[], y: number[], separator = ' ') => x.map((v, i) => `${v}${separator}${y[i]}`).join('\n');

describe('section coordinates reader', () => {
  const naca = nacaSection('2412', 40);

  it('reads a closed loop with a title, comments and any delimiter', () => {
    const text = `Tamsk T-62 root (invented)\n# x, y\n${loopText(naca.x, naca.y, ', ')}\n`;
    const parsed = parseSectionCoordinates(text);
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.title).toBe('Tamsk T-62 root (invented)');
    expect(parsed.layout).toBe('loop');
    expect(parsed.x).toEqual(naca.x);
    expect(parsed.lines[0]).toBe(3);
  });

  it('reads two surfaces from the nose, lower first, with point counts, and returns the loop', () => {
    const le = naca.x.indexOf(Math.min(...naca.x));
    const upper = { x: naca.x.slice(0, le + 1).reverse(), y: naca.y.slice(0, le + 1).reverse() };
    const lower = { x: naca.x.slice(le), y: naca.y.slice(le) };
    const text = `${lower.x.length}. ${upper.x.length}.\n\n${loopText(lower.x, lower.y, '\t')}\n\n${loopText(upper.x, upper.y, '\t')}\n`;
    const parsed = parseSectionCoordinates(text);
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.layout).toBe('twoSurfaces');
    expect(parsed.x).toEqual(naca.x);
    expect(parsed.y).toEqual(naca.y);
  });

  it('reads a loop given lower surface first, and says it turned it round', () => {
    const parsed = parseSectionCoordinates(loopText([...naca.x].reverse(), [...naca.y].reverse(), ';'));
    expect(parsed.ok && parsed.x).toEqual(naca.x);
    expect(parsed.ok && parsed.warnings[0]).toMatch(/lower surface first/);
  });

  it('names the line at fault', () => {
    const lines = loopText(naca.x, naca.y).split('\n');
    lines[6] = '0.5 abc';
    const bad = parseSectionCoordinates(lines.join('\n'));
    expect(bad).toEqual({ ok: false, problems: [{ line: 7, message: '"abc" is not a number' }] });
    lines[6] = '0.5 0.1 0.3';
    expect(parseSectionCoordinates(lines.join('\n'))).toEqual({ ok: false, problems: [{ line: 7, message: 'expected two numbers, x and y, found 3 fields' }] });
    expect(parseSectionCoordinates('1 0\n0.5 0.1\n0 0\n0.5 -0.1')).toMatchObject({ ok: false });
    const folded = loopText(naca.x, naca.y).split('\n');
    folded[3] = '0.2 0.05';
    const result = parseSectionCoordinates(folded.join('\n'));
    expect(result.ok).toBe(false);
    // Line 4 jumps forward to x = 0.2, which the loop allows; line 5 then goes back aft, which it does not.
    expect(!result.ok && result.problems[0].line).toBe(5);
  });

  it('puts a scaled and twisted section back on unit chord', () => {
    const twist = (3 * Math.PI) / 180;
    const x = naca.x.map((v, i) => 2 + 1.5 * (v * Math.cos(twist) + naca.y[i] * Math.sin(twist)));
    const y = naca.x.map((v, i) => 1.5 * (-v * Math.sin(twist) + naca.y[i] * Math.cos(twist)));
    const unit = normalizeSection(x, y);
    expect(unit.chord).toBeCloseTo(1.5 * Math.hypot(1, 0.5 * (naca.y[0] + naca.y.at(-1)!)), 6);
    expect(unit.twistDeg).toBeCloseTo(-3, 1);
    for (let i = 0; i < x.length; i += 7) {
      expect(unit.x[i]).toBeCloseTo(naca.x[i], 2);
      expect(unit.y[i]).toBeCloseTo(naca.y[i], 2);
    }
  });
});

describe('section geometry', () => {
  it('NACA four-digit thickness, camber and leading-edge radius (NACA Report 460: R = 1.1019 t²)', () => {
    for (const [designation, t, m, p] of [['0012', 0.12, 0, 0], ['2412', 0.12, 0.02, 0.4], ['4415', 0.15, 0.04, 0.4], ['0009', 0.09, 0, 0]] as const) {
      const section = nacaSection(designation, 120);
      const g = sectionGeometry(section.x, section.y);
      // Thickness is laid off normal to the mean line in Report 460; vertically it differs by < 0.2 % of t.
      expect(Math.abs(g.thickness - t) / t).toBeLessThan(0.003);
      // Maximum thickness of the four-digit thickness form lies at x = 0.2998 (from the polynomial).
      expect(g.thicknessAt).toBeCloseTo(0.3, 1);
      expect(g.camber).toBeCloseTo(m, 3);
      if (m > 0) expect(g.camberAt).toBeCloseTo(p, 1);
      // Symmetric sections: the published radius itself. Cambered ones: the geometric radius at the foremost
      // point differs by a few per cent, as the thickness is laid off along the tilted mean-line normal.
      expect(Math.abs(g.leadingEdgeRadius / (1.1019 * t * t) - 1)).toBeLessThan(m === 0 ? 0.003 : 0.04);
    }
  });

  it('re-panelling keeps the shape: geometry and nose radius of a re-panelled section', () => {
    const dense = nacaSection('4415', 150);
    const panelled = repanelSection(dense.x, dense.y, 120);
    expect(panelled.x.length).toBe(121);
    const g = sectionGeometry(panelled.x, panelled.y);
    expect(g.thickness).toBeCloseTo(0.15, 3);
    expect(Math.abs(g.leadingEdgeRadius / (1.1019 * 0.15 * 0.15) - 1)).toBeLessThan(0.05);
  });

  it('five-digit NACA 23012: maximum camber at 15 % chord (NACA Report 610 designation)', () => {
    const g = sectionGeometry(nacaSection('23012', 120).x, nacaSection('23012', 120).y);
    expect(g.camberAt).toBeCloseTo(0.15, 1);
    expect(g.thickness).toBeCloseTo(0.12, 3);
  });

  it('refuses designations it does not define', () => {
    expect(() => nacaSection('23112')).toThrow(/reflexed/);
    expect(() => nacaSection('2012')).toThrow(/both/);
    expect(() => nacaSection('abcd')).toThrow(/not a NACA/);
    expect(() => nacaSection('0000')).toThrow(/thickness/);
  });
});
