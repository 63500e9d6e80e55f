import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { stagnationPressureCoefficient } from './compressible';
import { inventedDemoSections } from './demo-sections';
import { parsePressureTable } from './pressure-table';

describe('invented Larkspur T-62 demo sections', () => {
  const sections = inventedDemoSections();

  it('are labelled as invented in their first line and parse as closed loops', () => {
    expect(sections.length).toBeGreaterThanOrEqual(2);
    for (const section of sections) {
      expect(section.pressureTable.split('\n')[0]).toMatch(/^# INVENTED DATA/);
      const table = parsePressureTable(section.pressureTable);
      if (!table.ok) throw new Error(JSON.stringify(table.problems));
      const first = table.rows[0];
      const last = table.rows.at(-1)!;
      expect([first.x, first.y]).toEqual([last.x, last.y]);
      for (const row of table.rows) expect(row.cp).toBeLessThanOrEqual(stagnationPressureCoefficient(section.flow.mach));
    }
  });

  it('have the stated 12 % thickness with its maximum well aft (an NLF shape)', () => {
    const table = parsePressureTable(sections[0].pressureTable);
    if (!table.ok) throw new Error('unreadable');
    const half = table.rows.length / 2;
    let best = { t: 0, x: 0 };
    for (let i = 0; i < half; i++) {
      const upper = table.rows[i];
      const lower = table.rows[table.rows.length - 1 - i];
      expect(upper.x).toBeCloseTo(lower.x, 12);
      const t = upper.y! - lower.y!;
      expect(t).toBeGreaterThanOrEqual(0);
      if (t > best.t) best = { t, x: upper.x };
    }
    expect(best.t).toBeCloseTo(0.12, 2);
    expect(best.x).toBeGreaterThan(0.38);
    expect(best.x).toBeLessThan(0.5);
  });

  it('give long laminar runs at cruise and an early upper-surface transition in the climb', () => {
    const [cruise, climb] = sections.map((section) => analyzeCase({ flow: section.flow, pressureTable: section.pressureTable }));
    for (const surface of cruise.surfaces) expect(surface.transition.s!).toBeGreaterThan(0.3);
    expect(climb.surfaces[0].transition.s!).toBeLessThan(0.1);
    expect(cruise.cd!).toBeGreaterThan(0.003);
    expect(cruise.cd!).toBeLessThan(climb.cd!);
    expect(cruise.warnings.some((w) => w.includes('supersonic'))).toBe(false);
  });
});
