import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { attachmentLineCheck, attachmentLineVerdict } from './attachment-line';

// The closed forms of R̄ are shared reference cases (./validation/attachment-line.ts), run by the
// validation page too.
describe('Poll’s attachment-line criterion', () => {
  it('verdicts at the thresholds 245 and 580 (Poll 1979, 1985)', () => {
    expect(attachmentLineVerdict(200)).toBe('laminar');
    expect(attachmentLineVerdict(300)).toBe('contaminationRisk');
    expect(attachmentLineVerdict(650)).toBe('unstable');
    expect(attachmentLineCheck({ reynolds: 1e7, sweepDeg: 25 })).toBeNull();
  });

  it('the analysis checks a swept case from the stagnation velocity gradient or the radius', () => {
    const s = Array.from({ length: 51 }, (_, i) => (i / 50) ** 2);
    const surfaces = [{ name: 'upper', s, ue: s.map((x) => 1.2 * Math.tanh(40 * x)) }];
    const swept = analyzeCase({ flow: { reynolds: 2e7 }, sweepDeg: 30, surfaces });
    // Its value (g = 48 from the stagnation gradient) is a shared reference case (./validation/attachment-line.ts).
    expect(swept.attachmentLine!.from).toBe('velocityGradient');
    const withRadius = analyzeCase({ flow: { reynolds: 2e7 }, sweepDeg: 30, leadingEdgeRadius: 0.01, surfaces });
    expect(withRadius.attachmentLine!.from).toBe('leadingEdgeRadius');
    expect(analyzeCase({ flow: { reynolds: 2e7 }, surfaces }).attachmentLine).toBeNull();
  });
});
