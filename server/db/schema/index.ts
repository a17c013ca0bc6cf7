export * from './auth.js';
export * from './builds.js';
export * from './pours.js';
export * from './shelf.js';
export * from './users.js';
export * from './workshops.js';
export * from './rollups.js';
export * from './sync.js';
