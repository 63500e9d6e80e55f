import type { EngineCaseInput, EngineResult } from '@laminote/contracts';
import { analyzeCase } from './analyze';
import { inviscidTable, sectionAt, type PreparedSection } from './section-case';

/**
 * A section's polar: at each incidence (or lift coefficient) of a range, the panel solution
 * (section-case.ts), then the engine's boundary-layer and transition analysis of its Cp (analyze.ts):
 * lift, moment, profile drag by Squire–Young, and where each criterion puts transition on each surface.
 * The geometry is factorised once; each point costs one superposition and one boundary-layer march.
 */

export interface PolarRange {
  by: 'alpha' | 'cl';
  from: number;
  to: number;
  points: number;
}

export interface PolarSurfacePoint {
  name: string;
  /** Governing transition as x/c, and what set it; null when the layer stays laminar to the end. */
  transitionX: number | null;
  transitionBy: string | null;
  /** x/c of each criterion's location (null where it has none). */
  criteria: Record<string, number | null>;
  laminarSeparationX: number | null;
  turbulentSeparationX: number | null;
  cd: number | null;
}

export interface PolarPoint {
  alphaDeg: number;
  cl: number;
  cm: number;
  cd: number | null;
  surfaces: PolarSurfacePoint[];
  warnings: string[];
}

export interface PolarFlow {
  reynolds: number;
  mach: number;
  nCrit?: number;
  turbulenceIntensity?: number;
}

/** Values of the range, evenly spaced. */
export function polarValues(range: PolarRange): number[] {
  if (range.points === 1) return [range.from];
  return Array.from({ length: range.points }, (_, k) => range.from + ((range.to - range.from) * k) / (range.points - 1));
}

export function polarPoint(prepared: PreparedSection, at: { alphaDeg?: number; cl?: number }, flow: PolarFlow, options: Pick<EngineCaseInput, 'criteria' | 'governing'> = {}): PolarPoint {
  const inviscid = sectionAt(prepared, at, flow.mach);
  const engineCase: EngineCaseInput = {
    flow: { reynolds: flow.reynolds, mach: flow.mach, ...(flow.nCrit !== undefined ? { nCrit: flow.nCrit } : {}), ...(flow.turbulenceIntensity !== undefined ? { turbulenceIntensity: flow.turbulenceIntensity } : {}) },
    pressureTable: inviscidTable(inviscid),
    ...options,
  };
  const result: EngineResult = analyzeCase(engineCase);
  return {
    alphaDeg: inviscid.alphaDeg,
    cl: inviscid.cl,
    cm: inviscid.cm,
    cd: result.cd,
    surfaces: result.surfaces.map((surface) => surfacePoint(surface)),
    warnings: result.warnings,
  };
}

function surfacePoint(surface: EngineResult['surfaces'][number]): PolarSurfacePoint {
  const xAt = (s: number | null | undefined): number | null => {
    if (s === null || s === undefined) return null;
    const stations = surface.stations;
    const x = stations.x;
    if (!x) return null;
    const ss = stations.s;
    if (s <= ss[0]) return x[0];
    for (let i = 1; i < ss.length; i++) {
      if (ss[i] >= s) return x[i - 1] + ((x[i] - x[i - 1]) * (s - ss[i - 1])) / (ss[i] - ss[i - 1]);
    }
    return x[x.length - 1];
  };
  const criteria: Record<string, number | null> = {};
  for (const [name, found] of Object.entries(surface.transition.criteria)) {
    criteria[name] = found && typeof found === 'object' && 's' in found && typeof found.s === 'number' ? xAt(found.s) : null;
  }
  return {
    name: surface.name,
    transitionX: xAt(surface.transition.s),
    transitionBy: surface.transition.by,
    criteria,
    laminarSeparationX: xAt(surface.laminarSeparation?.s),
    turbulentSeparationX: xAt(surface.turbulentSeparation?.s),
    cd: surface.cd,
  };
}

/** Every point of the range. */
export function computePolarPoints(prepared: PreparedSection, range: PolarRange, flow: PolarFlow, options: Pick<EngineCaseInput, 'criteria' | 'governing'> = {}): PolarPoint[] {
  return polarValues(range).map((value) => polarPoint(prepared, range.by === 'alpha' ? { alphaDeg: value } : { cl: value }, flow, options));
}
