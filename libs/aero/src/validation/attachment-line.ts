import { analyzeCase } from '../analyze';
import { attachmentLineReynolds, attachmentLineReynoldsFromRadius } from '../attachment-line';
import { digits, type ValidationSuite } from './case';

export const poll: ValidationSuite = {
  id: 'poll',
  title: 'Attachment line (Poll)',
  methods: ['poll'],
  summary: 'The attachment-line Reynolds number R̄ from the velocity gradient and from the leading-edge radius, in closed form.',
  cases: () => {
    const re = 2e7;
    const r = 0.01;
    const sweep = 30;
    return [
      {
        id: 'poll.radius-form',
        title: 'radius form of R̄ for a 30° swept circular leading edge, r = 0.01, Re = 2e7',
        quantity: 'R̄ (–)',
        tolerance: digits(8),
        source: 'D. I. A. Poll, Aeronaut. Q. 30 (1979): R̄ = √(Re r sin Λ tan Λ / 2) (closed form)',
        measure: () => ({ value: attachmentLineReynoldsFromRadius(re, sweep, r), reference: Math.sqrt((re * r * 0.5 * Math.tan(Math.PI / 6)) / 2) }),
      },
      {
        id: 'poll.gradient-form',
        title: 'velocity-gradient form equals the radius form for a circular leading edge',
        quantity: 'R̄ (–)',
        tolerance: digits(8),
        source: 'potential flow round a cylinder normal to the leading edge: Ue = 2 V∞ cos Λ sin(s/r), g = 2 cos Λ / r (closed form)',
        measure: () => ({ value: attachmentLineReynolds(re, sweep, (2 * Math.cos((sweep * Math.PI) / 180)) / r), reference: attachmentLineReynoldsFromRadius(re, sweep, r) }),
      },
      {
        id: 'poll.analysis',
        title: 'an analysis at 30° sweep finds R̄ from the stagnation velocity gradient (Ue = 1.2 tanh 40 s, g = 48)',
        quantity: 'R̄ (–)',
        tolerance: digits(-1),
        source: 'closed form R̄ = √(Re sin Λ tan Λ / (2g)) with g = 48: 0.5 √(Re/48)',
        measure: () => {
          const s = Array.from({ length: 51 }, (_, i) => (i / 50) ** 2);
          const swept = analyzeCase({ flow: { reynolds: re }, sweepDeg: 30, surfaces: [{ name: 'upper', s, ue: s.map((x) => 1.2 * Math.tanh(40 * x)) }] });
          return { value: swept.attachmentLine!.reBar, reference: 0.5 * Math.sqrt(re / 48) };
        },
      },
    ];
  },
};
