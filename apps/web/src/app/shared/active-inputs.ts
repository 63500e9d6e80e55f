import type { CellKind } from '@laminote/contracts';

/**
 * The input fields a cell keeps but does not use under its current choices, as its form hides them: a
 * flow given by Reynolds number keeps the altitude and length typed before, unused. Screens that show
 * a cell's inputs read-only (a saved version) leave these out, so they show only what was used.
 */
export function inactiveFields(kind: CellKind, inputs: Readonly<Record<string, unknown>>): ReadonlySet<string> {
  const unused: string[] = [];
  switch (kind) {
    case 'flow':
      unused.push(...(inputs['mode'] === 'reynolds' ? ['altitude_m', 'isaTemperatureOffset_K', 'referenceLength_m'] : ['reynolds']));
      unused.push(inputs['turbulenceMode'] === 'intensity' ? 'nCrit' : 'turbulenceIntensity');
      break;
    case 'flatPlate':
      unused.push(...(inputs['mode'] === 'dimensional' ? ['reynolds'] : ['length_m', 'speed_mps', 'kinematicViscosity_m2s']));
      unused.push(inputs['transitionMode'] === 'location' ? 'transitionReynolds' : 'transitionLocation');
      break;
    case 'leadingEdge':
      if (typeof inputs['flowCellId'] === 'string' && inputs['flowCellId'] !== '') unused.push('reynolds');
      unused.push(inputs['mode'] === 'radius' ? 'velocityGradient' : 'leadingEdgeRadius');
      break;
    case 'pressure':
      unused.push('uploadId');
      if (inputs['layout'] !== 'surface') unused.push('surfaceName', 'hasRadius');
      break;
    default:
      break;
  }
  return new Set(unused);
}
