/**
 * Which methods a computed result comes from, by id, without the methods catalogue (result-methods.ts
 * adds the catalogue's entries): the notebook's first screen imports this alone.
 */

/** Transition criterion key (as results name it) → the method that computes it. */
export const CRITERION_METHODS: Record<string, string> = {
  eN: 'envelope-en',
  crossflow: 'owen-randall',
  crossflowC1: 'arnal-c1',
  michel: 'michel',
  hRx: 'h-rex',
  granville: 'granville',
};

function record(value: unknown): Record<string, unknown> | null {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : null;
}

function analysisMethods(result: Record<string, unknown>): string[] {
  // An analysis of a section or body cell carries its panel solution; a body's layer is marched with Mangler's transformation.
  const inviscid = record(result['inviscid']);
  const ids = inviscid?.['kind'] === 'body' ? ['source-ring-panel', 'thwaites', 'mangler'] : inviscid ? ['vortex-panel', 'compressibility-correction', 'thwaites'] : ['thwaites'];
  const flow = record(result['flow']);
  if (typeof flow?.['mach'] === 'number' && flow['mach'] > 0) ids.push('compressible-thwaites');
  ids.push('head', 'squire-young');
  const surfaces = Array.isArray(result['surfaces']) ? result['surfaces'] : [];
  const criteria = new Set<string>();
  for (const surface of surfaces) {
    const transition = record(record(surface)?.['transition']);
    for (const key of Object.keys(record(transition?.['criteria']) ?? {})) criteria.add(key);
  }
  for (const key of criteria) if (CRITERION_METHODS[key]) ids.push(CRITERION_METHODS[key]);
  if (criteria.has('crossflow') || criteria.has('crossflowC1')) ids.push('simple-sweep', 'falkner-skan-cooke');
  if (result['attachmentLine']) ids.push('poll');
  return ids;
}

/**
 * The ids of the methods a cell's computed result comes from, in the order its numbers are worked out.
 * Apart from the catalogue (its formulas and sources are tens of kB), so a screen can list a result's
 * methods at once, named from method-names.ts, before the catalogue has loaded.
 */
export function resultMethodIds(kind: string, result: unknown): string[] {
  const r = record(result);
  if (!r) return [];
  let ids: string[];
  switch (kind) {
    case 'flow':
      ids = r['temperature_K'] !== null && r['temperature_K'] !== undefined ? ['isa', 'sutherland', 'mack'] : ['mack'];
      break;
    case 'pressure':
      ids = r['layout'] === 'closedLoop' ? ['stagnation', 'isentropic'] : ['isentropic'];
      break;
    case 'analysis':
      ids = analysisMethods(r);
      break;
    case 'sweep':
      ids = ['thwaites', 'head', 'envelope-en', 'squire-young'];
      break;
    case 'section':
      ids = ['vortex-panel', 'compressibility-correction'];
      break;
    case 'body':
      ids = ['source-ring-panel'];
      break;
    case 'polar': {
      const criteria = new Set<string>();
      for (const point of Array.isArray(r['points']) ? r['points'] : []) {
        for (const surface of Array.isArray(record(point)?.['surfaces']) ? (record(point)!['surfaces'] as unknown[]) : []) {
          for (const key of Object.keys(record(record(surface)?.['criteria']) ?? {})) criteria.add(key);
        }
      }
      ids = ['vortex-panel', 'compressibility-correction', 'thwaites', 'head', 'squire-young'];
      for (const key of criteria) if (CRITERION_METHODS[key]) ids.push(CRITERION_METHODS[key]);
      break;
    }
    case 'flatPlate':
      ids = ['flat-plate'];
      break;
    case 'leadingEdge':
      ids = ['poll'];
      break;
    default:
      ids = [];
  }
  return [...new Set(ids)];
}
