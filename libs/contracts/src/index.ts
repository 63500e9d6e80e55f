export * from './roles';
export * from './api';
export * from './engine';
export * from './notebook';
export * from './versions';
export * from './review';
export * from './methods';
