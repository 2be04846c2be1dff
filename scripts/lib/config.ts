// Where the local services listen. Two profiles so that `npm test` never touches the demo data
// of `npm start`. Every value can be overridden from the environment (see .env.example).
import { resolve } from 'node:path';

export type Profile = 'dev' | 'test';

const defaults = {
	dev: { pg: 54329, s3: 4569, smtp: 1025, mailWeb: 1080, app: 3000, pay: 4590, data: '.data' },
	test: { pg: 54339, s3: 4579, smtp: 1035, mailWeb: 1090, app: 4173, pay: 4591, data: '.test-data' }
} as const;

function num(name: string, fallback: number): number {
	const raw = process.env[name];
	if (!raw) return fallback;
	const value = Number(raw);
	if (!Number.isInteger(value) || value <= 0 || value > 65535) {
		throw new Error(`${name} must be a port number, got "${raw}"`);
	}
	return value;
}

export interface ServiceConfig {
	profile: Profile;
	host: '127.0.0.1';
	dataDir: string;
	pgPort: number;
	pgDatabase: string;
	s3Port: number;
	s3Bucket: string;
	smtpPort: number;
	mailWebPort: number;
	appPort: number;
	payPort: number;
}

export function serviceConfig(profile: Profile): ServiceConfig {
	const d = defaults[profile];
	return {
		profile,
		host: '127.0.0.1',
		dataDir: resolve(process.env.RILLSTONE_DATA_DIR ?? d.data),
		pgPort: num('PG_PORT', d.pg),
		pgDatabase: process.env.PG_DATABASE ?? (profile === 'test' ? 'rillstone_test' : 'rillstone'),
		s3Port: num('S3_PORT', d.s3),
		s3Bucket: process.env.S3_BUCKET ?? 'rillstone-private',
		smtpPort: num('SMTP_PORT', d.smtp),
		mailWebPort: num('MAIL_WEB_PORT', d.mailWeb),
		appPort: num('PORT', d.app),
		payPort: num('PAY_PORT', d.pay)
	};
}

export function databaseUrl(profile: Profile): string {
	const c = serviceConfig(profile);
	return `postgres://app@${c.host}:${c.pgPort}/${c.pgDatabase}`;
}

/** The environment the app process needs to reach the services of a profile. */
export function appEnv(profile: Profile): Record<string, string> {
	const c = serviceConfig(profile);
	const origin = process.env.ORIGIN ?? `http://${c.host}:${c.appPort}`;
	return {
		DATABASE_URL: process.env.DATABASE_URL ?? databaseUrl(profile),
		S3_ENDPOINT: process.env.S3_ENDPOINT ?? `http://${c.host}:${c.s3Port}`,
		S3_BUCKET: c.s3Bucket,
		S3_REGION: process.env.S3_REGION ?? 'us-east-1',
		S3_ACCESS_KEY_ID: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER',
		S3_SECRET_ACCESS_KEY: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
		SMTP_HOST: process.env.SMTP_HOST ?? c.host,
		SMTP_PORT: String(c.smtpPort),
		MAIL_FROM: process.env.MAIL_FROM ?? 'Copperleaf Water & Stone <office@copperleaf.example>',
		ORIGIN: origin,
		PUBLIC_ORIGIN: origin,
		HOST: c.host,
		PORT: String(c.appPort),
		BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '64M',
		// Local values for the stand-ins only: the app itself has no default for any secret.
		FORM_SECRET: process.env.FORM_SECRET ?? `rillstone-local-form-${profile}`,
		PAYMENTS_SECRET_KEY: process.env.PAYMENTS_SECRET_KEY ?? 'sk_test_rillstone_local',
		PAYMENTS_WEBHOOK_SECRET: process.env.PAYMENTS_WEBHOOK_SECRET ?? 'whsec_rillstone_local',
		PAYMENTS_API_HOST: process.env.PAYMENTS_API_HOST ?? c.host,
		PAYMENTS_API_PORT: process.env.PAYMENTS_API_PORT ?? String(c.payPort),
		PAYMENTS_API_PROTOCOL: process.env.PAYMENTS_API_PROTOCOL ?? 'http'
	};
}
