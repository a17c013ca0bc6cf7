export * from './users.js';
