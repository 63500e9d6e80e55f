import { describe, expect, it } from 'vitest';
import { ENGINE_LIMITS, engineCaseSchema, engineResultSchema, TRANSITION_CRITERIA } from './engine';

const surface = { name: 'upper', s: [0, 0.1, 0.2], ue: [0, 0.8, 1] };

describe('engine case schema', () => {
  it('applies the defaults of the contract', () => {
    const parsed = engineCaseSchema.parse({ flow: { reynolds: 6e6 }, surfaces: [surface] });
    expect(parsed.criteria).toEqual([...TRANSITION_CRITERIA]);
    expect(parsed.sweepDeg).toBe(0);
    expect(parsed.turbulent).toBe(true);
  });

  it('accepts the atmosphere form of the flow and a pasted table', () => {
    expect(engineCaseSchema.safeParse({ flow: { altitude_m: 10000, mach: 0.72, referenceLength_m: 2.1, isaTemperatureOffset_K: 10 }, pressureTable: 'x y cp\n1 0 0.1' }).success).toBe(true);
  });

  it('refuses what the engine cannot analyse, with the path of the field', () => {
    const issue = (input: unknown) => {
      const result = engineCaseSchema.safeParse(input);
      return result.success ? null : result.error.issues[0].path.join('.');
    };
    expect(issue({ flow: { reynolds: 6e6 } })).toBe('surfaces');
    expect(issue({ flow: { reynolds: 6e6, altitude_m: 1000 }, surfaces: [surface] })).toBe('flow.reynolds');
    expect(issue({ flow: { reynolds: 6e6, mach: 1 }, surfaces: [surface] })).toBe('flow.mach');
    expect(issue({ flow: { reynolds: 6e6 }, surfaces: [{ ...surface, s: [0, 0.1, 0.1] }] })).toBe('surfaces.0.s.2');
    expect(issue({ flow: { reynolds: 6e6 }, surfaces: [{ ...surface, r: [0, 1] }] })).toBe('surfaces.0.r');
    expect(issue({ flow: { reynolds: 6e6 }, surfaces: [surface], criteria: ['eN', 'intuition'] })).toBe('criteria.1');
    expect(issue({ flow: { reynolds: 6e6 }, surfaces: [surface], sweepDeg: 95 })).toBe('sweepDeg');
    const many = Array.from({ length: ENGINE_LIMITS.maxStationsPerSurface + 1 }, (_, i) => i);
    expect(issue({ flow: { reynolds: 6e6 }, surfaces: [{ name: 'big', s: many, ue: many }] })).toBe('surfaces.0.s');
  });
});

describe('engine result schema', () => {
  it('allows the gaps and nulls the engine reports', () => {
    const result = {
      engineVersion: '1.0.0',
      flow: { reynolds: 1e6, mach: 0, nCrit: 9, nCritFrom: 'default' },
      surfaces: [
        {
          name: 'upper',
          stations: { s: [0, 1], ue: [0, 1], theta: [0.001, null], deltaStar: [0.002, null], H: [2.3, null], cf: [null, null], n: [0, null] },
          transition: { s: null, by: null, criteria: { eN: null } },
          laminarSeparation: null,
          turbulentSeparation: { s: 0.9 },
          cd: null,
          cdFriction: null,
        },
      ],
      cd: null,
      attachmentLine: { reBar: 120, verdict: 'laminar', from: 'velocityGradient' },
      warnings: [],
    };
    expect(engineResultSchema.safeParse(result).success).toBe(true);
    expect(engineResultSchema.safeParse({ ...result, attachmentLine: { ...result.attachmentLine, verdict: 'fine' } }).success).toBe(false);
  });
});
