import type { AnalysisInputs, CellError, EngineResult, FlowInputs, SweepInputs, SweepResult } from '@laminote/contracts';
import { xAtArc } from '../arc-position';
import { analyzeWith } from './analysis';
import { CellInputError, toCellError } from './errors';
import { upstreamOf, type Upstream } from './types';

function sweptFlow(flow: FlowInputs, parameter: SweepInputs['parameter'], value: number): FlowInputs {
  switch (parameter) {
    case 'reynolds':
      return { ...flow, mode: 'reynolds', reynolds: value };
    case 'mach':
      return { ...flow, mach: value };
    case 'nCrit':
      return { ...flow, turbulenceMode: 'nCrit', nCrit: value };
    case 'sweepDeg':
      return { ...flow, sweepDeg: value };
  }
}

function analyzeStep(a: AnalysisInputs, flow: FlowInputs, pressure: Parameters<typeof analyzeWith>[2]): { result: EngineResult } | { error: CellError } {
  try {
    return { result: analyzeWith(a, flow, pressure) };
  } catch (error) {
    const cellError = toCellError(error);
    if (!cellError) throw error;
    return { error: cellError };
  }
}

/**
 * Parameter sweep: the named analysis re-run over `steps` evenly spaced values of one parameter of its
 * flow cell; a step that fails keeps its message and the others go on.
 */
export function computeSweep(sw: SweepInputs, upstream: Upstream): SweepResult {
  const analysis = upstreamOf(upstream, 'analysisCellId', 'analysis');
  const flow = upstreamOf(analysis.upstream, 'flowCellId', 'flow').inputs;
  const pressure = upstreamOf(analysis.upstream, 'pressureCellId', 'pressure').inputs;
  const values = Array.from({ length: sw.steps }, (_, i) => sw.from + ((sw.to - sw.from) * i) / (sw.steps - 1));
  const warnings = new Set<string>();
  const steps = values.map((value): SweepResult['steps'][number] => {
    const outcome = analyzeStep(analysis.inputs, sweptFlow(flow, sw.parameter, value), pressure);
    if ('error' in outcome) return { value, status: 'error', error: outcome.error, reynolds: null, cd: null, surfaces: [], attachmentLine: null };
    const r = outcome.result;
    for (const w of r.warnings) warnings.add(w);
    return {
      value,
      status: 'ok',
      error: null,
      reynolds: r.flow.reynolds,
      cd: r.cd,
      surfaces: r.surfaces.map((surface) => ({
        name: surface.name,
        transitionS: surface.transition.s,
        transitionX: xAtArc(surface.stations.s, surface.stations.x, surface.transition.s),
        by: surface.transition.by,
        laminarSeparationS: surface.laminarSeparation?.s ?? null,
        cd: surface.cd,
      })),
      attachmentLine: r.attachmentLine ? { reBar: r.attachmentLine.reBar, verdict: r.attachmentLine.verdict } : null,
    };
  });
  if (steps.every((step) => step.status === 'error')) {
    const first = steps[0]!.error!;
    throw new CellInputError(first.field ?? 'analysisCellId', `every step failed; at ${sw.parameter} = ${values[0]}: ${first.message}`, first.line);
  }
  return { parameter: sw.parameter, values, steps, warnings: [...warnings] };
}
