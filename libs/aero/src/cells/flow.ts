import type { EngineCaseInput, FlowInputs, FlowResult } from '@laminote/contracts';
import { MACK_TURBULENCE_RANGE, mackCriticalN } from '../envelope-en';
import { deriveFlowCondition } from '../flow-condition';

/** The flow cell as the engine case's `flow`. */
export function engineFlow(flow: FlowInputs): EngineCaseInput['flow'] {
  const base =
    flow.mode === 'reynolds'
      ? { reynolds: flow.reynolds, mach: flow.mach }
      : { altitude_m: flow.altitude_m, referenceLength_m: flow.referenceLength_m, isaTemperatureOffset_K: flow.isaTemperatureOffset_K, mach: flow.mach };
  return flow.turbulenceMode === 'intensity' ? { ...base, turbulenceIntensity: flow.turbulenceIntensity } : { ...base, nCrit: flow.nCrit };
}

/**
 * Flow condition: the free stream (ISA atmosphere and Sutherland viscosity when given by altitude, see
 * flow-condition.ts) and N_crit, given or from the turbulence level by Mack's relation (envelope-en.ts).
 */
export function computeFlow(flow: FlowInputs): FlowResult {
  const c = deriveFlowCondition(flow.mode === 'reynolds' ? { reynolds: flow.reynolds, mach: flow.mach } : engineFlow(flow));
  const warnings: string[] = [];
  let nCrit = flow.nCrit;
  if (flow.turbulenceMode === 'intensity') {
    const tu = flow.turbulenceIntensity!;
    nCrit = mackCriticalN(tu);
    if (tu < MACK_TURBULENCE_RANGE[0] || tu > MACK_TURBULENCE_RANGE[1]) {
      warnings.push(`turbulenceIntensity ${tu} is outside the range of Mack's relation (${MACK_TURBULENCE_RANGE[0]} to ${MACK_TURBULENCE_RANGE[1]}); N_crit is extrapolated`);
    }
  }
  return {
    reynolds: c.reynolds,
    mach: c.mach,
    reynoldsPerMetre: c.reynoldsPerMetre ?? null,
    speed_mps: c.speed_ms ?? null,
    kinematicViscosity_m2s: c.kinematicViscosity_m2s ?? null,
    dynamicPressure_Pa: c.dynamicPressure_Pa ?? null,
    temperature_K: c.temperature_K ?? null,
    pressure_Pa: c.pressure_Pa ?? null,
    density_kgm3: c.density_kgm3 ?? null,
    speedOfSound_mps: c.speedOfSound_ms ?? null,
    nCrit,
    nCritFrom: flow.turbulenceMode === 'intensity' ? 'turbulenceIntensity' : 'given',
    sweepDeg: flow.sweepDeg,
    warnings,
  };
}
