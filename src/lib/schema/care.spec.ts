import { describe, expect, it } from 'vitest';
import { fieldErrors } from './auth';
import { listedFeatures, publicSignUpSchema } from './care';

const form = {
	name: 'Marit Osei',
	email: 'Marit.Osei@Homeowner.example',
	street: '12 Heron Way',
	town: 'Linden Ford',
	postalCode: '80302',
	pondCount: '2',
	pondSize: 'large',
	planId: 'plan-1',
	billing: 'visit',
	accept: 'on',
	typedName: 'Marit Osei'
};

describe('the public care sign-up form', () => {
	it('reads counts and sizes into one entry per feature, unlisted kinds as none', () => {
		const parsed = publicSignUpSchema.parse(form);
		expect(parsed.email).toBe('marit.osei@homeowner.example');
		expect(listedFeatures(parsed)).toEqual([
			{ id: 'pond-1', kind: 'pond', size: 'large' },
			{ id: 'pond-2', kind: 'pond', size: 'large' }
		]);
	});

	it('puts each refusal on its own field', () => {
		const result = publicSignUpSchema.safeParse({
			...form,
			pondCount: '5',
			fountainSize: 'huge',
			billing: 'monthly'
		});
		expect(result.success).toBe(false);
		expect(fieldErrors(result.error!)).toEqual({
			pondCount: 'At most 4; call us for more',
			fountainSize: 'Pick a size',
			billing: 'Choose how to pay'
		});
	});

	it('asks for at least one feature', () => {
		const result = publicSignUpSchema.safeParse({ ...form, pondCount: '0' });
		expect(fieldErrors(result.error!)).toEqual({ features: 'Tell us about at least one feature' });
	});
});
