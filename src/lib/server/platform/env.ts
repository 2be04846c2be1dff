// Server settings come from the process environment (adapter-node, scripts and tests alike).
// Addresses default to the local stand-ins started by `npm start`; secrets never default (see
// .env.example): `npm start`, `npm test` and the bench scripts pass local values through
// scripts/lib/config.ts appEnv, and anything else must set them.
export const env = process.env;

export function origin(): string {
	return env.PUBLIC_ORIGIN ?? env.ORIGIN ?? 'http://127.0.0.1:3000';
}

export const isProduction = env.NODE_ENV === 'production';

/** The secrets the app refuses to run without, with what each one protects. */
export const SECRETS = {
	PAYMENTS_SECRET_KEY: 'the payment provider API key',
	PAYMENTS_WEBHOOK_SECRET: "the payment provider's webhook signing secret",
	FORM_SECRET: 'the key that signs the inquiry form stamp and the sign-in device cookies'
} as const;

export type SecretName = keyof typeof SECRETS;

export class MissingSecretError extends Error {
	constructor(readonly variable: SecretName) {
		super(
			`${variable} is not set (${SECRETS[variable]}). Set it in the environment before starting ` +
				'the app; `npm start` and `npm test` set local values themselves (see .env.example).'
		);
		this.name = 'MissingSecretError';
	}
}

/** The value of a secret, or a MissingSecretError naming the variable when it is unset or blank. */
export function requireSecret(
	name: SecretName,
	source: Record<string, string | undefined> = env
): string {
	const value = source[name]?.trim();
	if (!value) throw new MissingSecretError(name);
	return value;
}

/** Every secret that is missing, so start-up can refuse with all of them at once. */
export function missingSecrets(source: Record<string, string | undefined> = env): SecretName[] {
	return (Object.keys(SECRETS) as SecretName[]).filter((name) => !source[name]?.trim());
}
