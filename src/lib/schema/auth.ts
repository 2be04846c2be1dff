import { z } from 'zod';

export const PASSWORD_MIN = 12;
export const PASSWORD_MAX = 128;

export const email = z
	.string()
	.trim()
	.toLowerCase()
	.min(1, 'Enter your e-mail address')
	.max(254, 'That e-mail address is too long')
	.pipe(z.email('Enter a valid e-mail address, like name@example.com'));

export const newPassword = z
	.string()
	.min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`)
	.max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters`);

export const signInSchema = z.object({
	email,
	password: z.string().min(1, 'Enter your password').max(PASSWORD_MAX, 'Enter your password')
});

export const setPasswordSchema = z
	.object({ password: newPassword, confirm: z.string() })
	.refine((v) => v.password === v.confirm, {
		path: ['confirm'],
		message: 'The two passwords differ'
	});

export const roleSchema = z.enum(['owner', 'sales', 'crew'], { message: 'Pick a role' });

export const inviteSchema = z.object({
	email,
	name: z.string().trim().min(1, 'Enter their name').max(120, 'Keep the name under 120 characters'),
	role: roleSchema
});

export const forgotSchema = z.object({ email });

export type FormErrors = Record<string, string>;

/** Field errors of a failed parse, one message per field. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.join('.') || '_form';
		out[key] ??= issue.message;
	}
	return out;
}

/** Strings of a form, without files and secrets, to refill it after an error. */
export function formValues(
	data: FormData,
	omit: string[] = ['password', 'confirm']
): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [key, value] of data) {
		if (typeof value === 'string' && !omit.includes(key)) out[key] = value;
	}
	return out;
}
