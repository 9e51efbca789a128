/** The tests' own PostgreSQL server (shared with the benches): see scripts/lib/throwaway-postgres.ts. */
export { postgresBinDir, startThrowawayPostgres, type ThrowawayPostgres } from '../../scripts/lib/throwaway-postgres.js';
