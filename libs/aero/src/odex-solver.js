// Re-export of the odex integrator for the engine. odex ships its TypeScript sources beside its
// JavaScript, and those sources do not pass this workspace's strict checks; importing the package
// through this file and its declaration (odex-solver.d.ts) keeps them out of every type-check.
export { Solver } from 'odex';
