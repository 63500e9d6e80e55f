import type { AttachmentLineVerdict } from '@laminote/contracts';

/**
 * Poll's attachment-line criterion for swept leading edges.
 *
 * Source: D. I. A. Poll, "Transition in the infinite swept attachment line boundary layer",
 * Aeronautical Quarterly 30 (1979) 607–629, and "Some observations of the transition process on the
 * windward face of a long yawed cylinder", J. Fluid Mech. 150 (1985) 329–356. The attachment-line
 * Reynolds number is
 *   R̄ = W_e η / ν,   η = √(ν / (dUe/dx)),   W_e = V∞ sin Λ,
 * with dUe/dx the chordwise velocity gradient at the attachment line. With the case's
 * non-dimensional gradient g = d(Ue/V∞)/d(s/L):  R̄ = sin Λ √(Re / g).
 * From a leading-edge radius r (normal to the leading edge, divided by L), the gradient of a circular
 * cylinder in the normal plane, dUe/dx = 2 V∞ cos Λ / r, gives  R̄ = √(Re r sin Λ tan Λ / 2).
 * Thresholds: below R̄ ≈ 245 the attachment line stays laminar even when turbulence from a
 * wing–body junction reaches it; above it such contamination spreads along the leading edge; above
 * R̄ ≈ 580 the laminar attachment line becomes unstable and turns turbulent by itself (Poll 1979,
 * 1985; values quoted from memory).
 */

export const POLL_CONTAMINATION_RE_BAR = 245;
export const POLL_INSTABILITY_RE_BAR = 580;

/** R̄ from the chordwise velocity gradient g = d(Ue/V∞)/d(s/L) at the attachment line. */
export function attachmentLineReynolds(reynolds: number, sweepDeg: number, velocityGradient: number): number {
  return Math.abs(Math.sin((sweepDeg * Math.PI) / 180)) * Math.sqrt(reynolds / velocityGradient);
}

/** R̄ from the leading-edge radius r/L measured normal to the leading edge. */
export function attachmentLineReynoldsFromRadius(reynolds: number, sweepDeg: number, leadingEdgeRadius: number): number {
  const sweep = Math.abs((sweepDeg * Math.PI) / 180);
  return Math.sqrt((reynolds * leadingEdgeRadius * Math.sin(sweep) * Math.tan(sweep)) / 2);
}

/** Poll's verdict for an attachment-line Reynolds number. */
export function attachmentLineVerdict(reBar: number): AttachmentLineVerdict {
  if (reBar < POLL_CONTAMINATION_RE_BAR) return 'laminar';
  if (reBar < POLL_INSTABILITY_RE_BAR) return 'contaminationRisk';
  return 'unstable';
}

export interface AttachmentLineCheck {
  reBar: number;
  verdict: AttachmentLineVerdict;
  from: 'velocityGradient' | 'leadingEdgeRadius';
}

/**
 * The attachment-line check of a swept leading edge: from the radius when it is given, else from the
 * velocity gradient; null when neither is available.
 */
export function attachmentLineCheck(input: {
  reynolds: number;
  sweepDeg: number;
  velocityGradient?: number | null;
  leadingEdgeRadius?: number | null;
}): AttachmentLineCheck | null {
  const { reynolds, sweepDeg, velocityGradient, leadingEdgeRadius } = input;
  if (leadingEdgeRadius != null && leadingEdgeRadius > 0) {
    const reBar = attachmentLineReynoldsFromRadius(reynolds, sweepDeg, leadingEdgeRadius);
    return { reBar, verdict: attachmentLineVerdict(reBar), from: 'leadingEdgeRadius' };
  }
  if (velocityGradient != null && velocityGradient > 0) {
    const reBar = attachmentLineReynolds(reynolds, sweepDeg, velocityGradient);
    return { reBar, verdict: attachmentLineVerdict(reBar), from: 'velocityGradient' };
  }
  return null;
}
