import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { featureSchema, pinSchema } from '$lib/schema/care';
import { requireRole } from '$lib/server/auth/access';
import { CareError } from '$lib/server/care/db';
import {
	addFeature,
	addressOf,
	featuresOf,
	locateByPostal,
	locationOf,
	propertyRecord,
	removeFeature,
	setPin,
	updateFeature
} from '$lib/server/care/features';
import { domainAction } from '$lib/server/http/domain';
import { sendPlanOffer } from '$lib/server/care/offers';
import { featurePhotoLinks, storeCarePhoto } from '$lib/server/care/photos';
import { planById } from '$lib/server/care/plans';
import { currentSubscription } from '$lib/server/care/subscriptions';
import { visitsOfSubscription } from '$lib/server/care/service';
import { PhotoError } from '$lib/server/platform/images';
import { StorageUnavailableError } from '$lib/server/platform/storage';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

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
					visits: await visitsOfSubscription(subscription.id)
				}
			: null
	};
};

export const actions: Actions = {
	addFeature: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		await record(event.params.id);
		const parsed = await parseForm(event.request, featureSchema, { extra: { form: 'feature' } });
		if (!parsed.ok) return parsed.failure;
		await addFeature(event.params.id, parsed.data, user.id);
		return { form: 'feature', saved: true };
	},
	editFeature: async (event) => {
		requireRole(event, 'owner', 'sales');
		await record(event.params.id);
		const data = await event.request.formData();
		const featureId = String(data.get('featureId') ?? '');
		const parsed = await parseForm(data, featureSchema, { extra: { form: 'edit', featureId } });
		if (!parsed.ok) return parsed.failure;
		const done = await domainAction(async () => {
			await updateFeature(event.params.id, featureId, parsed.data);
		}, 'edit');
		if (done) return done;
		return { form: 'edit', featureId, saved: true };
	},
	removeFeature: async (event) => {
		requireRole(event, 'owner', 'sales');
		const parsed = await parseForm(event.request, z.object({ featureId: z.string().min(1) }), {
			extra: { form: 'remove' },
			message: 'Pick a feature'
		});
		if (!parsed.ok) return parsed.failure;
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
		const parsed = await parseForm(event.request, pinSchema, { extra: { form: 'pin' } });
		if (!parsed.ok) return parsed.failure;
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
		const done = await domainAction(() => sendPlanOffer(event.params.id), 'offer');
		if (done) return done;
		return { form: 'offer', saved: true };
	}
};
