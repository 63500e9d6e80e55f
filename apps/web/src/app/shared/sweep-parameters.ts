import type { SweepInputs } from '@laminote/contracts';

/** The parameters a sweep varies, as the sweep cell and the comparison name them. */
export const PARAMETER_LABELS: Record<SweepInputs['parameter'], string> = {
  reynolds: 'Reynolds number Re',
  mach: 'Mach number M∞',
  nCrit: 'Critical N-factor N_crit',
  sweepDeg: 'Leading-edge sweep Λ (°)',
};
