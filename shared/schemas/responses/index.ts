// Schemas and types of the API's answers, shared by the server (views checked with `satisfies`) and the client.
export * from './common.js';
export * from './fleet.js';
export * from './reading-sets.js';
export * from './events.js';
export * from './screenings.js';
export * from './auth.js';
export * from './admin.js';
export * from './outbox.js';
export * from './notifications.js';
export * from './followups.js';
export * from './criteria.js';
export * from './security.js';
