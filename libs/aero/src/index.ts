/**
 * @laminote/aero — the boundary-layer and transition engine. Pure TypeScript, no DOM, no Node APIs.
 */
export { analyzeCase, CaseError, ENGINE_CAUTION, ENGINE_VERSION } from './analyze';
export * from './atmosphere';
export * from './attachment-line';
export * from './compressible';
export * from './demo-sections';
export * from './demo-nacelle';
export * from './envelope-en';
export * from './flat-plate';
export * from './flow-condition';
export * from './granville';
export * from './h-rex';
export * from './head';
export * from './michel';
export * from './pressure-table';
export * from './surface-checks';
export * from './smoothing';
export * from './squire-young';
export * from './stagnation';
export * from './thwaites';
export * from './arc-position';
export * from './cells/index';
export { METHODS, findMethod, resultMethods, type MethodEntry, type MethodSymbol } from './methods';
export { VALIDATION_SUITES, runCase, runValidation, type ValidationCaseResult, type ValidationSuite, type ValidationSuiteResult, type Tolerance } from './validation';
export * from './axisymmetric-panel';
export * from './compressibility-correction';
export * from './naca-sections';
export * from './polar';
export * from './section-case';
export * from './shape-input';
export * from './section-coordinates';
export * from './section-geometry';
export * from './vortex-panel';
