// How the product starts its server for real use (`npm run serve`, and the production side of
// `npm start`): sized for the one-gigabyte server a small firm rents (README, "On a one-gigabyte
// server"). The benchmarks start the app the same way unless told otherwise, so that their
// figures are the product's.

/** Node's heap: a ceiling on the old generation and a small young generation. */
export const SERVER_NODE_FLAGS = ['--max-old-space-size=128', '--max-semi-space-size=2'] as const;

/**
 * The process environment the server starts with; a value already set in the environment wins.
 * MALLOC_ARENA_MAX: glibc otherwise gives each thread that decodes a photo an allocation arena of
 * its own, which keeps the memory it once held. DATABASE_POOL_SIZE: five queries at once keep two
 * cores busy and leave connections for migrations, backups and psql.
 */
export const SERVER_ENV = { MALLOC_ARENA_MAX: '2', DATABASE_POOL_SIZE: '5' } as const;

/** SERVER_ENV under the given environment (which wins). */
export function serverEnv(env: NodeJS.ProcessEnv): NodeJS.ProcessEnv {
	return { ...SERVER_ENV, ...env };
}
