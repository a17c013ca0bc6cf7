export * from './auth.js';
export * from './users.js';
export * from './workshops.js';
