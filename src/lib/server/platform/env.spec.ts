import { afterEach, describe, expect, it } from 'vitest';
import { MissingSecretError, missingSecrets, requireSecret } from './env';
import { webhookSecret } from '../payments/provider';

describe('secrets have no default', () => {
	const saved = process.env.PAYMENTS_WEBHOOK_SECRET;
	afterEach(() => {
		if (saved === undefined) delete process.env.PAYMENTS_WEBHOOK_SECRET;
		else process.env.PAYMENTS_WEBHOOK_SECRET = saved;
	});

	it('refuses a missing or blank secret and names the variable', () => {
		expect(() => requireSecret('FORM_SECRET', {})).toThrow(MissingSecretError);
		expect(() => requireSecret('FORM_SECRET', {})).toThrow(/^FORM_SECRET is not set/);
		expect(() => requireSecret('PAYMENTS_SECRET_KEY', { PAYMENTS_SECRET_KEY: '  ' })).toThrow(
			/^PAYMENTS_SECRET_KEY is not set/
		);
	});

	it('returns a secret that is set', () => {
		expect(requireSecret('FORM_SECRET', { FORM_SECRET: 'k3y' })).toBe('k3y');
	});

	it('lists every missing secret for the start-up check', () => {
		expect(missingSecrets({})).toEqual([
			'PAYMENTS_SECRET_KEY',
			'PAYMENTS_WEBHOOK_SECRET',
			'FORM_SECRET'
		]);
		expect(missingSecrets({ PAYMENTS_SECRET_KEY: 'a', PAYMENTS_WEBHOOK_SECRET: 'b' })).toEqual([
			'FORM_SECRET'
		]);
	});

	it('the webhook check no longer falls back to the well-known local secret', () => {
		delete process.env.PAYMENTS_WEBHOOK_SECRET;
		expect(() => webhookSecret()).toThrow(/PAYMENTS_WEBHOOK_SECRET is not set/);
		process.env.PAYMENTS_WEBHOOK_SECRET = 'whsec_from_env';
		expect(webhookSecret()).toBe('whsec_from_env');
	});
});
