import { formatError, formatTolerance, formatValue } from './validation-page';

describe('validation page numbers', () => {
  it('prints values to five figures, very large or small ones in exponent form', () => {
    expect(formatValue(0.67082123)).toBe('0.67082');
    expect(formatValue(2340700)).toBe('2.3407e+6');
    expect(formatValue(1.7894e-5)).toBe('1.7894e-5');
    expect(formatValue(null)).toBe('—');
  });

  it('prints a relative tolerance and difference in per cent, an absolute one to two figures', () => {
    expect(formatTolerance({ tolerance: { kind: 'relative', value: 0.015 } })).toBe('± 1.5 %');
    expect(formatTolerance({ tolerance: { kind: 'absolute', value: 5e-4 } })).toBe('± 5.0e-4');
    expect(formatError({ tolerance: { kind: 'relative', value: 0.015 }, error: 0.0103 })).toBe('+1.03 %');
    expect(formatError({ tolerance: { kind: 'absolute', value: 0.005 }, error: -0.0014741 })).toBe('-0.0015');
    expect(formatError({ tolerance: { kind: 'absolute', value: 1 }, error: null })).toBe('—');
  });
});
