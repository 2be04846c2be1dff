import { error, fail } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { fieldErrors } from '$lib/schema/auth';
import { featureSchema, pinSchema } from '$lib/schema/care';
import { requireRole } from '$lib/server/auth/access';
import { db } from '$lib/server/platform/db';
import { serviceVisits } from '$lib/server/platform/db/schema';
import { CareError } from '$lib/server/care/db';
import {
	addFeature,
	addressOf,
	featuresOf,
	locateByPostal,
	locationOf,
	propertyRecord,
	removeFeature,
	setPin
} from '$lib/server/care/features';
import { careAction } from '$lib/server/care/http';
import { sendPlanOffer } from '$lib/server/care/offers';
import { featurePhotoLinks, storeCarePhoto } from '$lib/server/care/photos';
import { planById } from '$lib/server/care/plans';
import { currentSubscription } from '$lib/server/care/subscriptions';
import { PhotoError } from '$lib/server/platform/images';
import { StorageUnavailableError } from '$lib/server/platform/storage';
import type { Actions, PageServerLoad } from './$types';

async function record(id: string) {
	try {
		return await propertyRecord(id);
	} catch (e) {
		if (e instanceof CareError) error(404, e.message);
		throw e;
	}
}

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'owner', 'sales');
	const { property, contact } = await record(event.params.id);
	const [features, location, subscription] = await Promise.all([
		featuresOf(property.id),
		locationOf(property.id),
		currentSubscription(property.id)
	]);
	const photos = await featurePhotoLinks(features.map((f) => f.id));
	return {
		property: { id: property.id, address: addressOf(property), postalCode: property.postalCode },
		contact: { name: contact.name, email: contact.email, phone: contact.phone },
		features: features.map((f) => ({ ...f, photos: photos[f.id] ?? [] })),
		location,
		subscription: subscription
			? {
					...subscription,
					planName: (await planById(subscription.planId)).name,
					visits: await db
						.select()
						.from(serviceVisits)
						.where(eq(serviceVisits.subscriptionId, subscription.id))
						.orderBy(serviceVisits.windowStart)
				}
			: null
	};
};

export const actions: Actions = {
	addFeature: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		await record(event.params.id);
		const values = Object.fromEntries(await event.request.formData());
		const parsed = featureSchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, { form: 'feature', errors: fieldErrors(parsed.error), values });
		}
		await addFeature(event.params.id, parsed.data, user.id);
		return { form: 'feature', saved: true };
	},
	removeFeature: async (event) => {
		requireRole(event, 'owner', 'sales');
		const parsed = z
			.object({ featureId: z.string().min(1) })
			.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { form: 'remove', message: 'Pick a feature' });
		await removeFeature(event.params.id, parsed.data.featureId);
		return { form: 'remove', saved: true };
	},
	featurePhoto: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const featureId = String(data.get('featureId') ?? '');
		const features = await featuresOf((await record(event.params.id)).property.id);
		if (!features.some((f) => f.id === featureId)) {
			return fail(400, { form: 'photo', message: 'Pick a feature' });
		}
		const file = data.get('photo');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { form: 'photo', featureId, message: 'Choose a photo first' });
		}
		try {
			await storeCarePhoto({ featureId }, file, user.id);
		} catch (e) {
			if (e instanceof PhotoError) {
				return fail(400, { form: 'photo', featureId, message: e.message });
			}
			if (e instanceof StorageUnavailableError) {
				return fail(503, {
					form: 'photo',
					featureId,
					message: 'Photo storage is out of reach; try again shortly.'
				});
			}
			throw e;
		}
		return { form: 'photo', saved: true };
	},
	pin: async (event) => {
		requireRole(event, 'owner', 'sales');
		await record(event.params.id);
		const values = Object.fromEntries(await event.request.formData());
		const parsed = pinSchema.safeParse(values);
		if (!parsed.success) {
			return fail(400, { form: 'pin', errors: fieldErrors(parsed.error), values });
		}
		await setPin(event.params.id, parsed.data.lat, parsed.data.lng);
		return { form: 'pin', saved: true };
	},
	postal: async (event) => {
		requireRole(event, 'owner', 'sales');
		const { property } = await record(event.params.id);
		const found = await locateByPostal(property.id);
		if (!found) {
			return fail(400, {
				form: 'postal',
				message: `The postal code “${property.postalCode}” is not in the postal data; place a pin instead.`
			});
		}
		return { form: 'postal', saved: true };
	},
	offer: async (event) => {
		requireRole(event, 'owner', 'sales');
		await record(event.params.id);
		const done = await careAction(() => sendPlanOffer(event.params.id), 'offer');
		if (done) return done;
		return { form: 'offer', saved: true };
	}
};
