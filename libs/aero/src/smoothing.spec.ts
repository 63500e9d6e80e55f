import { describe, expect, it } from 'vitest';
import { automaticHalfWidth, estimateScatter, fitPolynomial, leastSquaresSlope, leastSquaresValue, smoothedSlope } from './smoothing';

/** Deterministic pseudo-random numbers (Park–Miller), so the scatter is the same on every run. */
function random(seed: number) {
  let state = seed;
  return () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
}

describe('least-squares differentiation', () => {
  it('is exact for a quadratic on irregular spacing', () => {
    const next = random(7);
    const s = [0];
    for (let i = 1; i < 40; i++) s.push(s[i - 1] + 0.01 + 0.04 * next());
    const f = s.map((x) => 0.3 + 1.7 * x - 0.9 * x * x);
    const slope = leastSquaresSlope(s, f, new Float64Array(s.length));
    s.forEach((x, i) => expect(slope[i]).toBeCloseTo(1.7 - 1.8 * x, 10));
  });

  it('turns pressure-tap scatter into a usable slope', () => {
    // Ue = 1 + 0.2 sin(3 s) sampled at 60 taps with ±0.2 % scatter: the two-point difference is
    // swamped by the noise, the least-squares slope stays within a fraction of the true range.
    const next = random(11);
    const s = Array.from({ length: 60 }, (_, i) => 0.02 + (i / 59) * 0.96);
    const exact = s.map((x) => 0.6 * Math.cos(3 * x));
    const ue = s.map((x) => 1 + 0.2 * Math.sin(3 * x) + 0.002 * (2 * next() - 1));
    const smoothed = leastSquaresSlope(s, ue, new Float64Array(s.length), 3);
    const rms = (values: number[]) => Math.sqrt(values.reduce((a, v) => a + v * v, 0) / values.length);
    const smoothError = rms(exact.map((e, i) => smoothed[i] - e));
    const differenceError = rms(exact.slice(1).map((e, i) => (ue[i + 1] - ue[i]) / (s[i + 1] - s[i]) - e));
    expect(smoothError).toBeLessThan(0.5 * differenceError);
    expect(smoothError).toBeLessThan(0.1);
  });

  it('fits polynomials by least squares (QR, ml-matrix)', () => {
    const t = [0, 0.1, 0.2, 0.3, 0.4, 0.5];
    const c = fitPolynomial(t, t.map((x) => 2 - x + 3 * x ** 3), 3, 0, 5, 0.2);
    // Expanded about 0.2: 2 − (u + 0.2) + 3(u + 0.2)³ = 1.824 − 0.64 u + 1.8 u² + 3 u³.
    expect(c[0]).toBeCloseTo(1.824, 10);
    expect(c[1]).toBeCloseTo(-0.64, 10);
    expect(c[2]).toBeCloseTo(1.8, 10);
    expect(c[3]).toBeCloseTo(3, 10);
  });

  it('gives the smoothed value of the same fit, exact for a quadratic', () => {
    const s = Array.from({ length: 30 }, (_, i) => (i / 29) ** 1.3);
    const f = s.map((x) => 0.3 + 1.7 * x - 0.9 * x * x);
    const value = leastSquaresValue(s, f, new Float64Array(s.length), 4);
    s.forEach((_, i) => expect(value[i]).toBeCloseTo(f[i], 12));
  });
});

describe('smoothing width from the estimated scatter', () => {
  // Uniform scatter on [−a, a] has standard deviation a/√3 (exact, the uniform distribution).
  const taps = (amplitude: number, seed: number) => {
    const next = random(seed);
    const s = Array.from({ length: 60 }, (_, i) => 0.02 + (i / 59) * 0.96);
    return { s, ue: s.map((x) => 1 + 0.2 * Math.sin(3 * x) + amplitude * (2 * next() - 1)), exact: s.map((x) => 0.6 * Math.cos(3 * x)) };
  };

  it('estimates the scatter of tap data within 25 %', () => {
    for (const [amplitude, seed] of [[0.002, 11], [0.01, 5], [0.004, 3]] as const) {
      const { s, ue } = taps(amplitude, seed);
      expect(estimateScatter(s, ue) / (amplitude / Math.sqrt(3))).toBeGreaterThan(0.75);
      expect(estimateScatter(s, ue) / (amplitude / Math.sqrt(3))).toBeLessThan(1.25);
    }
  });

  it('keeps the narrow window on clean data and widens it on scattered taps, where the slope improves', () => {
    const { s, ue: clean } = taps(0, 1);
    expect(automaticHalfWidth(s, clean.map((v) => Number(v.toFixed(5)))).halfWidth).toBe(2);
    // Coarse but clean: 16 stations of a curved distribution, as a panel code might give; the
    // curvature is not taken for scatter.
    const coarse = Array.from({ length: 16 }, (_, i) => (i / 15) ** 1.5);
    expect(automaticHalfWidth(coarse, coarse.map((x) => 1 + 0.2 * Math.sin(3 * x) + 0.3 * x * x)).halfWidth).toBe(2);
    const { ue, exact } = taps(0.004, 11);
    const auto = automaticHalfWidth(s, ue);
    expect(auto.halfWidth).toBeGreaterThan(2);
    const rms = (h: number) => {
      const slope = leastSquaresSlope(s, ue, new Float64Array(s.length), h);
      return Math.sqrt(exact.reduce((a, e, i) => a + (slope[i] - e) ** 2, 0) / s.length);
    };
    expect(rms(auto.halfWidth)).toBeLessThan(0.6 * rms(2));
  });

  it('gives the analysis the same width, scatter and slope as the separate steps, to the bit', () => {
    // smoothedSlope reuses the scatter estimate's five-station fits as the half-width-2 slope; the
    // reference is automaticHalfWidth, estimateScatter and leastSquaresSlope called one by one.
    const { s, ue: clean } = taps(0, 1);
    const { ue: scattered } = taps(0.004, 11);
    const long = Array.from({ length: 2500 }, (_, i) => i / 2499);
    const cases: [number[], number[]][] = [
      [s, clean],
      [s, scattered],
      [s.slice(0, 7), clean.slice(0, 7)],
      [s.slice(0, 5), clean.slice(0, 5)],
      [long, long.map((x) => Math.tanh(40 * x) * (1.2 - 0.3 * x))],
    ];
    for (const [x, f] of cases) {
      for (const width of ['auto', 1, 2, 3] as const) {
        const slope = new Float64Array(x.length);
        const got = smoothedSlope(x, f, width, slope);
        const expected = width === 'auto' ? automaticHalfWidth(x, f) : { halfWidth: width, scatter: estimateScatter(x, f) };
        expect(got).toEqual(expected);
        expect(Array.from(slope)).toEqual(Array.from(leastSquaresSlope(x, f, new Float64Array(x.length), expected.halfWidth)));
      }
    }
  });
});
