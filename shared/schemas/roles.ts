import { z } from 'zod';
import { ROLES, type Role } from './enums.js';

// The five roles of the brief (the list lives in enums.ts); a user may hold several.
export { ROLES, type Role };
export const roleSchema = z.enum(ROLES);
