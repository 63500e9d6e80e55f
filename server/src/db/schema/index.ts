export * from './identity';
export * from './projects';
export * from './studies';
export * from './review';
export * from './jobs';
export * from './tokens';
