import type { LeadingEdgeInputs, LeadingEdgeResult } from '@laminote/contracts';
import { attachmentLineCheck, POLL_CONTAMINATION_RE_BAR, POLL_INSTABILITY_RE_BAR } from '../attachment-line';
import { fail } from './errors';
import { computeFlow } from './flow';
import { optionalUpstreamOf, type Upstream } from './types';

/**
 * Leading-edge check: Poll's attachment-line Reynolds number (attachment-line.ts) from the sweep and
 * the leading-edge radius or velocity gradient; the Reynolds number from the named flow cell, if any.
 */
export function computeLeadingEdge(le: LeadingEdgeInputs, upstream: Upstream): LeadingEdgeResult {
  const flow = optionalUpstreamOf(upstream, 'flowCellId', 'flow');
  const reynolds = flow ? computeFlow(flow.inputs).reynolds : le.reynolds!;
  const check = attachmentLineCheck({
    reynolds,
    sweepDeg: le.sweepDeg,
    leadingEdgeRadius: le.mode === 'radius' ? le.leadingEdgeRadius : null,
    velocityGradient: le.mode === 'gradient' ? le.velocityGradient : null,
  });
  if (!check) fail(le.mode === 'radius' ? 'leadingEdgeRadius' : 'velocityGradient', 'give a leading-edge radius or a velocity gradient greater than zero');
  const warnings = le.sweepDeg === 0 ? ['no sweep: the attachment line carries no spanwise flow, so the check does not apply'] : [];
  return {
    reynolds,
    sweepDeg: le.sweepDeg,
    reBar: check.reBar,
    verdict: check.verdict,
    from: check.from,
    thresholds: { contamination: POLL_CONTAMINATION_RE_BAR, instability: POLL_INSTABILITY_RE_BAR },
    warnings,
  };
}
