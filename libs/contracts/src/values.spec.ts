import { describe, expect, it } from 'vitest';
import { isUuid, sameJson, sci } from './values';

describe('plain helpers', () => {
  it('compares JSON values blind to key order', () => {
    expect(sameJson({ a: 1, b: [1, { c: 2, d: null }] }, { b: [1, { d: null, c: 2 }], a: 1 })).toBe(true);
    expect(sameJson({ a: 1 }, { a: 1, b: undefined })).toBe(true);
    expect(sameJson([1, 2], [2, 1])).toBe(false);
    expect(sameJson({ a: [] }, { a: {} })).toBe(false);
    expect(sameJson(null, {})).toBe(false);
  });

  it('writes numbers plain in the middle range and as powers of ten outside it', () => {
    expect(sci(0.7234)).toBe('0.723');
    expect(sci(2.3148e7)).toBe('2.31 × 10⁷');
    expect(sci(6e6, 6, true)).toBe('6 × 10⁶');
    expect(sci(3.9e-5, 6, true)).toBe('3.9 × 10⁻⁵');
    expect(sci(0)).toBe('0');
    expect(sci(null)).toBe('—');
    expect(sci(Number.NaN)).toBe('—');
  });

  it('knows a UUID', () => {
    expect(isUuid('0f8fad5b-d9cb-469f-a165-70867728950e')).toBe(true);
    expect(isUuid('0F8FAD5B-D9CB-469F-A165-70867728950E')).toBe(true);
    expect(isUuid('not-a-uuid')).toBe(false);
    expect(isUuid(42)).toBe(false);
  });
});
