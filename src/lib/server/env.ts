// Server settings come from the process environment (adapter-node, scripts and tests alike).
// Defaults fit the local stand-ins started by `npm start`; see .env.example.
export const env = process.env;

export function origin(): string {
	return env.PUBLIC_ORIGIN ?? env.ORIGIN ?? 'http://127.0.0.1:3000';
}

export const isProduction = env.NODE_ENV === 'production';
