// The web app's one door to zod. Everything here loads as one lazy chunk (components/schemas.ts),
// so the first page load carries no zod: see "Web budgets" in DEVELOPERS.md. zod-setup must run
// before any schema is built, so it is the first import.
import './zod-setup';

export { zodResolver } from '@hookform/resolvers/zod';
export * from '../shared/burn/marks';
export * from '../shared/criteria/types';
export * from '../shared/schemas/audit';
export * from '../shared/schemas/auth';
export * from '../shared/schemas/batch';
export * from '../shared/schemas/burn';
export * from '../shared/schemas/chemical';
export * from '../shared/schemas/criteria';
export * from '../shared/schemas/error';
export * from '../shared/schemas/health';
export * from '../shared/schemas/invitation';
export * from '../shared/schemas/lab';
export * from '../shared/schemas/pair-import';
export * from '../shared/schemas/ranking';
export * from '../shared/schemas/recipe';
export * from '../shared/schemas/roles';
export * from '../shared/schemas/treatment';
export * from './client-schemas';
