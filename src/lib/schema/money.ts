// A typed amount of money at the boundary: the field's text through parseCents, so every form
// reads dollars the same way and refuses what is not an amount with the form's own words.
import { z } from 'zod';
import { parseCents, type ParseCentsOptions } from '$lib/money';

/** A text field holding dollars → integer cents, or `message` beside the field. */
export const centsField = (message: string, options?: ParseCentsOptions) =>
	z.string().transform((v, ctx) => {
		const cents = parseCents(v, options);
		if (cents === null) {
			ctx.addIssue({ code: 'custom', message });
			return z.NEVER;
		}
		return cents;
	});
