import { describe, expect, it } from 'vitest';
import { fieldPathLabel, readableMessage } from './field-words';

describe('field words', () => {
  it('says a field path as the label the cell shows', () => {
    expect(fieldPathLabel('turbulenceIntensity', 'flow')).toBe('Turbulence level');
    expect(fieldPathLabel('flow.mach')).toBe('Mach number');
    expect(fieldPathLabel('trips.upper', 'analysis')).toBe('Trip on upper at x/c');
    expect(fieldPathLabel('pressureTable line 7')).toBe('Pressure table, line 7');
    expect(fieldPathLabel('inputs.reynolds', 'flow')).toBe('Reynolds number');
    expect(fieldPathLabel('somethingUnknown')).toBeNull();
  });

  it('puts the labels into the messages people read (the reports from trying the notebook)', () => {
    expect(readableMessage("turbulenceIntensity 0.0002 is outside the range of Mack's relation (0.0007 to 0.0298); N_crit is extrapolated", 'flow')).toBe(
      "Turbulence level 0.0002 is outside the range of Mack's relation (0.0007 to 0.0298); N_crit is extrapolated",
    );
    expect(readableMessage('mach 0.5: the local flow is supersonic at x/c 0.1', 'analysis')).toBe('Mach number 0.5: the local flow is supersonic at x/c 0.1');
    expect(readableMessage('reynolds must be greater than zero', 'flow')).toBe('Reynolds number must be greater than zero');
    expect(readableMessage('the trip lies beyond the surface (trips.upper)', 'analysis')).toBe('The trip lies beyond the surface (Trip on upper at x/c)');
    expect(readableMessage('give reynolds, or name a flow cell (flowCellId)', 'leadingEdge')).toBe('Give reynolds, or name a flow cell (Flow cell)');
    // Plain words are left alone, even when a field has the same name.
    expect(readableMessage('the laminar layer separates before transition')).toBe('The laminar layer separates before transition');
    expect(readableMessage('at most 200 cells per run')).toBe('At most 200 cells per run');
    expect(readableMessage('x/c runs 1.000 → 0.000 (line 22) → 1.000')).toBe('x/c runs 1.000 → 0.000 (line 22) → 1.000');
  });
});
