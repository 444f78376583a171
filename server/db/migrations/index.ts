import { Init1796177966222 } from './1796177966222-init.js';

// Migrations in order, imported as classes (globs of .ts files break under vitest).
export const migrations = [Init1796177966222];
