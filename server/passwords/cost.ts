export type Argon2Cost = { memoryKiB: number; iterations: number; parallelism: number };

// Source: OWASP Password Storage Cheat Sheet, Argon2id: m=19456 KiB (19 MiB), t=2, p=1
export const OWASP_ARGON2ID: Argon2Cost = { memoryKiB: 19456, iterations: 2, parallelism: 1 };

/**
 * Tests only: cheap enough that a test can hash dozens of times, far too cheap to protect a real
 * password. Configuration refuses it in production.
 */
export const TEST_ARGON2ID: Argon2Cost = { memoryKiB: 256, iterations: 1, parallelism: 1 };
