import { fail } from '@sveltejs/kit';
import { formValues } from '$lib/schema/auth';
import { parseForm, type FormValues } from '$lib/server/platform/forms';
import { requireRole } from '$lib/server/auth/access';
import {
	estimatingConfig,
	laborFormSchema,
	laborRateRows,
	listItems,
	pumpFormSchema,
	pumpModelRows,
	removeItem,
	saveEstimatingSettings,
	saveLaborRate,
	savePump,
	settingsFormSchema
} from '$lib/server/pricelist/catalog';
import { taskHours } from '$lib/server/pricelist/csv';
import { saveTaskRates, taskRatesFormSchema } from '$lib/server/pricelist/task-rates';
import { settingsSchema } from '$lib/estimating/schema';
import { itemFormSchema, saveItem } from '$lib/server/pricelist/item-form';
import { saveYardSettings } from '$lib/server/pricelist/yard';
import { yardValues } from '$lib/estimating/yard-fields';
import { confirmRateSchema } from '$lib/schema/costing';
import {
	confirmRate,
	learnedRates,
	rateChanges,
	RateChangeError
} from '$lib/server/costing/learning';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const [items, pumps, rates, config] = await Promise.all([
		listItems(),
		pumpModelRows(),
		laborRateRows(),
		estimatingConfig()
	]);
	const hours = taskHours(config.engine).map(({ spec, hours }) => ({
		id: spec.id,
		label: spec.label,
		unit: spec.unit,
		hours
	}));
	const parsed = settingsSchema.safeParse(config.engine ?? {});
	const engine = parsed.success ? parsed.data : settingsSchema.parse({});
	const crew = {
		baseCrewSize: engine.labor.baseCrewSize,
		machineDigAboveYd3: engine.labor.machineDigAboveYd3,
		truckCapacityTons: engine.equipment.truckCapacityTons
	};
	// What finished jobs say about each task-hours setting (the owner may take the proposal).
	const [learned, changes] = await Promise.all([learnedRates(), rateChanges()]);
	return {
		items,
		pumps,
		rates,
		config,
		taskHours: hours,
		crew,
		yard: yardValues(config.engine),
		learned,
		changes,
		canEdit: user.role === 'owner'
	};
};

/** A record the engine's own check refused as a whole: its messages, one a line, for the form. */
const refused = (form: string, values: FormValues, problems: string[]) =>
	fail(400, { form, values, errors: { _form: problems.join('\n') } });

export const actions: Actions = {
	confirmRate: async (event) => {
		const user = requireRole(event, 'owner');
		const parsed = await parseForm(event.request, confirmRateSchema, {
			extra: { form: 'rate' },
			message: 'Pick a proposal'
		});
		if (!parsed.ok) return parsed.failure;
		try {
			const done = await confirmRate(user, parsed.data.rateKey, parsed.data.proposedHours);
			return { form: 'rate', rateKey: parsed.data.rateKey, changed: done };
		} catch (e) {
			if (e instanceof RateChangeError) {
				return fail(400, { form: 'rate', rateKey: parsed.data.rateKey, message: e.message });
			}
			throw e;
		}
	},
	item: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, itemFormSchema, { extra: { form: 'item' } });
		if (!parsed.ok) return parsed.failure;
		const saved = await saveItem(parsed.data);
		if ('fieldErrors' in saved) {
			return fail(400, { form: 'item', values: parsed.values, errors: saved.fieldErrors });
		}
		return { form: 'item', saved: saved.item.sku };
	},
	remove: async (event) => {
		requireRole(event, 'owner');
		const data = await event.request.formData();
		const sku = String(data.get('sku') ?? '');
		if (!sku) return fail(400, { form: 'remove', values: {}, errors: { _form: 'No item named' } });
		await removeItem(sku);
		return { form: 'remove', removed: sku };
	},
	pump: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, pumpFormSchema, { extra: { form: 'pump' } });
		if (!parsed.ok) return parsed.failure;
		const errors = await savePump(parsed.data);
		if (errors.length) return refused('pump', parsed.values, errors);
		return { form: 'pump', saved: parsed.data.id };
	},
	labor: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, laborFormSchema, { extra: { form: 'labor' } });
		if (!parsed.ok) return parsed.failure;
		await saveLaborRate(parsed.data);
		return { form: 'labor', saved: parsed.data.id };
	},
	rates: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, taskRatesFormSchema, {
			extra: { form: 'rates' }
		});
		if (!parsed.ok) return parsed.failure;
		const errors = await saveTaskRates(parsed.data as Record<string, number>);
		if (errors.length) return refused('rates', parsed.values, errors);
		return { form: 'rates', saved: 'rates' };
	},
	settings: async (event) => {
		requireRole(event, 'owner');
		const parsed = await parseForm(event.request, settingsFormSchema, {
			extra: { form: 'settings' }
		});
		if (!parsed.ok) return parsed.failure;
		const errors = await saveEstimatingSettings(parsed.data);
		if (errors.length) return refused('settings', parsed.values, errors);
		return { form: 'settings', saved: 'settings' };
	},
	yard: async (event) => {
		requireRole(event, 'owner');
		const data = await event.request.formData();
		const errors = await saveYardSettings(data);
		if (Object.keys(errors).length) {
			return fail(400, { form: 'yard', values: formValues(data), errors });
		}
		return { form: 'yard', saved: 'yard' };
	}
};
