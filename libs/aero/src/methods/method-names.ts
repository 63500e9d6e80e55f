/**
 * Every method's name, by id: the catalogue's entries (flow.ts, inviscid.ts, boundary-layer.ts,
 * transition.ts) take their names from here. Apart from the catalogue (its formulas and sources are tens
 * of kB), so a screen can name and link the methods of a result before the catalogue has loaded.
 */
export const METHOD_NAMES = {
  isa: 'International Standard Atmosphere',
  sutherland: 'Sutherland’s viscosity law',
  isentropic: 'Isentropic Cp and edge velocity',
  stagnation: 'Stagnation point and arc length',
  'simple-sweep': 'Simple sweep theory (infinite swept wing)',
  smoothing: 'Least-squares smoothing and differentiation',
  'naca-sections': 'NACA four- and five-digit sections',
  'vortex-panel': 'Linear-strength vortex panel method',
  'compressibility-correction': 'Kármán–Tsien and Prandtl–Glauert corrections',
  'source-ring-panel': 'Source-ring panel method for bodies of revolution',
  thwaites: 'Thwaites’ laminar method',
  'compressible-thwaites': 'Compressible laminar layer (Stewartson–Illingworth, Eckert’s reference temperature)',
  'falkner-skan-cooke': 'Falkner–Skan–Cooke profiles (infinite swept wing)',
  mangler: 'Mangler transformation (bodies of revolution)',
  head: 'Head’s entrainment method',
  'squire-young': 'Squire–Young profile drag',
  'flat-plate': 'Flat-plate friction estimates',
  'envelope-en': 'Envelope eᴺ method',
  mack: 'Mack’s relation for the critical N',
  michel: 'Michel’s criterion',
  'h-rex': 'H–Re_x correlation',
  granville: 'Granville’s criterion',
  'owen-randall': 'Crossflow Reynolds number (Owen–Randall)',
  'arnal-c1': 'Arnal’s C1 crossflow criterion',
  poll: 'Poll’s attachment-line criterion',
} as const satisfies Record<string, string>;

export type MethodId = keyof typeof METHOD_NAMES;

/** Whether the catalogue has a method of this id (a result may name one whose page does not exist yet). */
export function isMethodId(id: string): id is MethodId {
  return Object.hasOwn(METHOD_NAMES, id);
}
