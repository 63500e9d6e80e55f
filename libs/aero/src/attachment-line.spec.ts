import { describe, expect, it } from 'vitest';
import { analyzeCase } from './analyze';
import { attachmentLineCheck, attachmentLineReynolds, attachmentLineReynoldsFromRadius, attachmentLineVerdict } from './attachment-line';

describe('Poll’s attachment-line criterion', () => {
  it('the radius form is the velocity-gradient form for a circular leading edge', () => {
    // Potential flow round a cylinder of radius r normal to the leading edge at V∞ cos Λ:
    // Ue = 2 V∞ cos Λ sin(s/r), so g = 2 cos Λ / r (closed form).
    const re = 2e7;
    const r = 0.01;
    const sweep = 30;
    const g = (2 * Math.cos((sweep * Math.PI) / 180)) / r;
    expect(attachmentLineReynolds(re, sweep, g)).toBeCloseTo(attachmentLineReynoldsFromRadius(re, sweep, r), 8);
    // R̄ = √(Re r sin Λ tan Λ / 2) = √(2e7 · 0.01 · 0.5 · 0.57735 / 2)
    expect(attachmentLineReynoldsFromRadius(re, sweep, r)).toBeCloseTo(Math.sqrt((2e7 * 0.01 * 0.5 * Math.tan(Math.PI / 6)) / 2), 8);
  });

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
    expect(swept.attachmentLine!.from).toBe('velocityGradient');
    // g = d(1.2 tanh 40 s)/ds at s = 0 is 48.
    expect(swept.attachmentLine!.reBar).toBeCloseTo(0.5 * Math.sqrt(2e7 / 48), -1);
    const withRadius = analyzeCase({ flow: { reynolds: 2e7 }, sweepDeg: 30, leadingEdgeRadius: 0.01, surfaces });
    expect(withRadius.attachmentLine!.from).toBe('leadingEdgeRadius');
    expect(analyzeCase({ flow: { reynolds: 2e7 }, surfaces }).attachmentLine).toBeNull();
  });
});
