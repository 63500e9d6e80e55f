export * from './roles';
export * from './api';
