export * from './auth.js';
export * from './accounts.js';
