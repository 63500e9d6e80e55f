/**
 * Complete elliptic integrals of the first and second kind, K(m) and E(m), by the arithmetic–geometric
 * mean (M. Abramowitz and I. A. Stegun, "Handbook of Mathematical Functions", 1964, §17.6):
 *   a0 = 1, b0 = √m1, c0 = √m;  a_{n+1} = (a_n + b_n)/2, b_{n+1} = √(a_n b_n), c_{n+1} = (a_n − b_n)/2;
 *   K = π / (2 a_N),  E = K (1 − ½ Σ 2^n c_n²).
 * The argument is the complementary parameter m1 = 1 − m = k′², so that K near its logarithmic
 * singularity (m → 1) keeps full precision when the caller forms m1 directly.
 */
export function completeEllipticIntegrals(complementaryParameter: number): { K: number; E: number } {
  const m1 = complementaryParameter;
  if (!(m1 > 0 && m1 <= 1)) throw new RangeError(`complementary parameter ${m1} outside (0, 1]`);
  let a = 1;
  let b = Math.sqrt(m1);
  let c = Math.sqrt(Math.max(0, 1 - m1));
  let sum = c * c;
  let power = 1;
  for (let n = 0; n < 40 && Math.abs(c) > 1e-16 * a; n++) {
    const an = 0.5 * (a + b);
    const bn = Math.sqrt(a * b);
    c = 0.5 * (a - b);
    a = an;
    b = bn;
    power *= 2;
    sum += power * c * c;
  }
  const K = Math.PI / (2 * a);
  return { K, E: K * (1 - 0.5 * sum) };
}
