// Schemas shared by the server (validation at the boundary) and the client (forms).
export * from './roles.js';
export * from './auth.js';
export * from './fleet.js';
export * from './screening.js';
