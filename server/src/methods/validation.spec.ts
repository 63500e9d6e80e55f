import { describe, expect, it } from 'vitest';
import { VALIDATION_SUITES, type ValidationSuite } from '@laminote/aero';
import { validationReportSchema } from '@laminote/contracts';
import { runValidationReport } from './validation';

describe('the validation report', () => {
  const report = runValidationReport();

  it('lists every shared case, in the list’s order, and they all pass', () => {
    expect(validationReportSchema.parse(report)).toBeTruthy();
    expect(report.suites.map((s) => s.id)).toEqual(VALIDATION_SUITES.map((s) => s.id));
    const ids = VALIDATION_SUITES.flatMap((s) => s.cases().map((c) => c.id));
    expect(report.suites.flatMap((s) => s.cases.map((c) => c.id))).toEqual(ids);
    expect(report.total).toBe(ids.length);
    expect(report.passed).toBe(report.total);
  });

  it('shows a case that misses its reference, or throws, as failing rather than failing the page', () => {
    const broken: ValidationSuite = {
      id: 'broken',
      title: 'broken',
      methods: [],
      summary: '',
      cases: () => [
        { id: 'off', title: 'off', quantity: 'x', source: 'test', tolerance: { kind: 'relative', value: 0.01 }, measure: () => ({ value: 1.1, reference: 1 }) },
        { id: 'throws', title: 'throws', quantity: 'x', source: 'test', tolerance: { kind: 'absolute', value: 1 }, measure: () => { throw new Error('no'); } },
      ],
    };
    const result = runValidationReport([broken]);
    expect(result.passed).toBe(0);
    expect(result.suites[0].cases.map((c) => c.pass)).toEqual([false, false]);
    expect(result.suites[0].cases[1].value).toBeNull();
    expect(validationReportSchema.parse(JSON.parse(JSON.stringify(result)))).toBeTruthy();
  });
});
