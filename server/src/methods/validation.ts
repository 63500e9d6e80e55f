import { ENGINE_VERSION, VALIDATION_SUITES, runCase, type ValidationSuite } from '@laminote/aero';
import type { ValidationReport, ValidationSuiteResultDto } from '@laminote/contracts';

/**
 * Runs the engine's shared reference cases, the same list its tests run. A case that throws is a
 * failing case with no value, never a server error: the page shows it red.
 */
export function runValidationReport(suites: readonly ValidationSuite[] = VALIDATION_SUITES): ValidationReport {
  const started = performance.now();
  const results: ValidationSuiteResultDto[] = suites.map((suite) => {
    let cases: ReturnType<ValidationSuite['cases']> = [];
    try {
      cases = suite.cases();
    } catch {
      cases = [];
    }
    return {
      id: suite.id,
      title: suite.title,
      methods: [...suite.methods],
      summary: suite.summary,
      cases: cases.map((c) => {
        try {
          const r = runCase(c);
          return { ...r, value: Number.isFinite(r.value) ? r.value : null, error: Number.isFinite(r.error) ? r.error : null };
        } catch {
          return { id: c.id, title: c.title, quantity: c.quantity, source: c.source, tolerance: c.tolerance, reference: null, value: null, error: null, pass: false };
        }
      }),
    };
  });
  const all = results.flatMap((s) => s.cases);
  return {
    engineVersion: ENGINE_VERSION,
    ranAt: new Date().toISOString(),
    durationMs: Math.round(performance.now() - started),
    passed: all.filter((c) => c.pass).length,
    total: all.length,
    suites: results,
  };
}
