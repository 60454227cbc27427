import { z } from 'zod';
import { roles, unitSystems } from '../terms/roles';

export * from '../terms/roles';

export const roleSchema = z.enum(roles);
export const unitSystemSchema = z.enum(unitSystems);
