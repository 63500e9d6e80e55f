import { engineResultSchema } from '@laminote/contracts';
import { describe, expect, it } from 'vitest';
import { analyzeCase, CaseError, ENGINE_VERSION } from './analyze';
import { stations } from '../test/cases';

const s = stations(61);
const good = { flow: { reynolds: 4e6 }, surfaces: [{ name: 'upper', s, ue: s.map((x) => Math.min(1, 30 * x) * (1.1 - 0.1 * x)) }] };

function caseError(input: unknown): CaseError {
  try {
    analyzeCase(input);
  } catch (error) {
    if (error instanceof CaseError) return error;
    throw error;
  }
  throw new Error('expected a CaseError');
}

describe('analyzeCase input checks', () => {
  const surface = (over: Record<string, unknown>) => ({ flow: { reynolds: 1e6 }, surfaces: [{ name: 'w', s: [0, 0.1, 0.2, 0.3], ue: [0, 0.5, 0.8, 1], ...over }] });
  const cases: [string, unknown, string, RegExp][] = [
    ['not an object', [1, 2], 'case', /JSON object/],
    ['nothing to analyse', { flow: { reynolds: 1e6 } }, 'surfaces', /nothing to analyse/],
    ['no flow', { surfaces: [] }, 'flow', /missing/],
    ['Re <= 0', { flow: { reynolds: 0 }, surfaces: [] }, 'flow.reynolds', /greater than zero/],
    ['supersonic', { flow: { reynolds: 1e6, mach: 1.4 }, pressureTable: 'x cp' }, 'flow.mach', /supersonic/],
    ['typo', { flow: { reynold: 1e6 }, pressureTable: '1 0' }, 'flow.reynold', /unknown field/],
    ['lengths', surface({ ue: [0, 1, 1] }), 'surfaces[0].ue', /3 values but s has 4/],
    ['non-number', surface({ ue: [0, 1, '1.2', 1] }), 'surfaces[0].ue[2]', /must be a number/],
    ['s not increasing', surface({ s: [0, 0.2, 0.1, 0.3] }), 'surfaces[0].s[2]', /must increase/],
    ['negative Ue', surface({ ue: [0, 0.5, -0.1, 1] }), 'surfaces[0].ue[2]', /must not be negative/],
    ['ue and cp', surface({ cp: [1, 0.5, 0.2, 0] }), 'surfaces[0].ue', /exactly one/],
    ['trip outside', surface({ trip: 2 }), 'surfaces[0].trip', /outside the surface/],
    ['few stations', surface({ s: [0, 1], ue: [0, 1] }), 'surfaces[0].s', /at least 3/],
    ['Cp above stagnation', { flow: { reynolds: 1e6, mach: 0.5 }, surfaces: [{ name: 'w', s: [0, 0.1, 0.2], cp: [1.07, 0.5, 0] }] }, 'surfaces[0].cp[0]', /above the stagnation value/],
    ['both inputs', { ...surface({}), pressureTable: '1 0' }, 'pressureTable', /not both/],
    ['same names', { flow: { reynolds: 1e6 }, surfaces: [surface({}).surfaces[0], surface({}).surfaces[0]] }, 'surfaces[1].name', /twice/],
    ['unknown criterion', { ...surface({}), criteria: ['eN', 'guess'] }, 'criteria[1]', /.+/],
    ['altitude without length', { flow: { altitude_m: 9000, mach: 0.7 }, surfaces: surface({}).surfaces }, 'flow.referenceLength_m', /missing/],
  ];
  for (const [label, input, field, message] of cases) {
    it(`${label} → ${field}`, () => {
      const error = caseError(input);
      expect(error.field).toBe(field);
      expect(error.message.startsWith(`${field}: `)).toBe(true);
      expect(error.message).toMatch(message);
      expect(error.message).not.toContain('\n');
    });
  }
});

describe('analyzeCase result', () => {
  it('matches the contract schema, with the engine version', () => {
    const result = analyzeCase(good);
    expect(engineResultSchema.safeParse(result).success).toBe(true);
    expect(result.engineVersion).toBe(ENGINE_VERSION);
    expect(JSON.parse(JSON.stringify(result))).toEqual(result);
  });

  it('sums the surfaces’ drag', () => {
    const twice = analyzeCase({ ...good, surfaces: [good.surfaces[0], { ...good.surfaces[0], name: 'lower' }] });
    expect(twice.cd).toBeCloseTo(2 * twice.surfaces[0].cd!, 12);
  });

  it('converts Cp with the free-stream Mach number and warns about a supersonic pocket', () => {
    const cp = [1, 0.5, -0.2, -0.9, -0.6, -0.3];
    const sc = [0, 0.01, 0.05, 0.2, 0.6, 1];
    const low = analyzeCase({ flow: { reynolds: 1e7 }, surfaces: [{ name: 'w', s: sc, cp }] });
    expect(low.surfaces[0].stations.ue[3]).toBeCloseTo(Math.sqrt(1.9), 12);
    const high = analyzeCase({ flow: { reynolds: 1e7, mach: 0.75 }, surfaces: [{ name: 'w', s: sc, cp: cp.map((c, i) => (i === 0 ? 1.14 : c)) }] });
    expect(high.warnings.some((w) => w.includes('supersonic pocket'))).toBe(true);
    expect(high.warnings.some((w) => w.includes('incompressible'))).toBe(true);
  });

  it('derives the Reynolds number from ISA altitude, Mach number and length', () => {
    const result = analyzeCase({ flow: { altitude_m: 11000, mach: 0.7, referenceLength_m: 2 }, surfaces: good.surfaces });
    expect(result.flow.reynolds).toBeGreaterThan(9e6);
    expect(result.flow.reynolds).toBeLessThan(1.3e7);
  });
});
