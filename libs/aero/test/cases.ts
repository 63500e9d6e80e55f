/** Test helpers: the same grids and helpers the shared validation cases use. */
export { analyzeOne, geometricStations, nearest, relative, stations } from '../src/validation/support';
