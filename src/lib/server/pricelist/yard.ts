// Saves the yard work settings (fields in $lib/estimating/yard-fields.ts) into the engine's
// settings, validated by the engine's own schema.
import { settingsSchema } from '$lib/estimating/schema';
import { db } from '../platform/db';
import { estimatingSettings } from '../platform/db/schema';
import { estimatingConfig } from './catalog';
import { YARD_FIELDS } from '$lib/estimating/yard-fields';

/** Checks the posted fields with the engine's schema and stores them; messages by field name. */
export async function saveYardSettings(data: FormData): Promise<Record<string, string>> {
	const errors: Record<string, string> = {};
	const current = await estimatingConfig();
	const engine = structuredClone((current.engine ?? {}) as Record<string, unknown>);
	for (const group of YARD_FIELDS) {
		const target = { ...((engine[group.group] as Record<string, unknown>) ?? {}) };
		for (const field of group.fields) {
			const raw = String(data.get(field.name) ?? '').trim();
			const n = Number(raw);
			if (raw === '' || !Number.isFinite(n)) {
				errors[field.name] = 'Enter a number';
				continue;
			}
			const [, key, sub] = field.name.split('.');
			if (sub) target[key] = { ...((target[key] as Record<string, unknown>) ?? {}), [sub]: n };
			else target[key] = n;
		}
		const check = settingsSchema.shape[group.group].safeParse(target);
		if (!check.success) {
			for (const issue of check.error.issues) {
				const name = [group.group, ...issue.path.map(String)].join('.');
				errors[name] ??= issue.message;
			}
		}
		engine[group.group] = target;
	}
	if (Object.keys(errors).length) return errors;
	await db
		.insert(estimatingSettings)
		.values({ id: 1, engine, validDays: current.validDays, terms: current.terms })
		.onConflictDoUpdate({ target: estimatingSettings.id, set: { engine } });
	return {};
}
