export * from './auth.js';
