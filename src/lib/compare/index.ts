/** Comparing two photographs of one jar and their mark layers: registration, overlap, changes, fluid level. */
export * from './analysis.ts';
export * from './changes.ts';
export * from './fluid.ts';
export * from './grid.ts';
export * from './overlap.ts';
export * from './pairs.ts';
export * from './registration.ts';
export * from './schema.ts';
