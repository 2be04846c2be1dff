import { fail } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schema/auth';
import {
	itemSupplierSchema,
	orderIdSchema,
	orderUpdateSchema,
	receiveLineSchema,
	supplierSchema
} from '$lib/schema/purchasing';
import { requireRole } from '$lib/server/auth/access';
import { domainAction as jobAction, orHttp } from '$lib/server/http/domain';
import { jobFor } from '$lib/server/jobs/read';
import { jobRef } from '$lib/server/jobs/labels';
import {
	addSupplier,
	listSuppliers,
	makeOrders,
	ordersOfJob,
	receiveOrder,
	sendOrder,
	setItemSupplier,
	updateOrder
} from '$lib/server/purchasing/orders';
import type { Actions, PageServerLoad } from './$types';
import { parseForm } from '$lib/server/platform/forms';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'owner', 'sales');
	const job = await orHttp(() => jobFor(user, event.params.id));
	const [orders, supplierList] = await Promise.all([ordersOfJob(job.id), listSuppliers()]);
	return {
		job: { id: job.id, ref: jobRef(job.number), title: job.title },
		...orders,
		suppliers: supplierList.map((s) => ({ id: s.id, name: s.name, email: s.email }))
	};
};

export const actions: Actions = {
	supplier: async (event) => {
		requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = await parseForm(data, supplierSchema, { extra: { form: 'supplier' } });
		if (!parsed.ok) return parsed.failure;
		return jobAction(async () => {
			await addSupplier(parsed.data);
			return { form: 'supplier', saved: true };
		}, 'supplier');
	},
	itemSupplier: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		await orHttp(() => jobFor(user, event.params.id));
		const parsed = await parseForm(event.request, itemSupplierSchema, {
			extra: { form: 'itemSupplier' },
			message: true
		});
		if (!parsed.ok) return parsed.failure;
		return jobAction(
			() => setItemSupplier(parsed.data.sku, parsed.data.supplierId),
			'itemSupplier'
		);
	},
	make: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		return jobAction(
			async () => ({ form: 'make', made: await makeOrders(user, event.params.id) }),
			'make'
		);
	},
	update: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const parsed = await parseForm(data, orderUpdateSchema, {
			extra: { form: 'update', orderId: String(data.get('orderId') ?? '') }
		});
		if (!parsed.ok) return parsed.failure;
		const { orderId, ...input } = parsed.data;
		return jobAction(async () => {
			await updateOrder(user, event.params.id, orderId, input);
			return { form: 'update', orderId, saved: true };
		}, 'update');
	},
	send: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const parsed = await parseForm(event.request, orderIdSchema, {
			extra: { form: 'send' },
			message: 'Pick an order'
		});
		if (!parsed.ok) return parsed.failure;
		return jobAction(async () => {
			await sendOrder(user, event.params.id, parsed.data.orderId);
			return { form: 'send', orderId: parsed.data.orderId, sent: true };
		}, 'send');
	},
	receive: async (event) => {
		const user = requireRole(event, 'owner', 'sales');
		const data = await event.request.formData();
		const orderId = String(data.get('orderId') ?? '');
		const quantities = data.getAll('quantity').map(String);
		const costs = data.getAll('cost').map(String);
		const errors: Record<string, string> = {};
		const lines = data
			.getAll('lineId')
			.map(String)
			.flatMap((lineId, i) => {
				const parsed = receiveLineSchema.safeParse({
					lineId,
					quantity: quantities[i] ?? '',
					cost: costs[i] ?? ''
				});
				if (parsed.success) {
					return [{ lineId, quantity: parsed.data.quantity, costCents: parsed.data.cost }];
				}
				for (const [k, m] of Object.entries(fieldErrors(parsed.error))) {
					errors[`${lineId}.${k}`] ??= m;
				}
				return [];
			});
		if (!orderId || Object.keys(errors).length || !lines.length) {
			return fail(400, {
				form: 'receive',
				orderId,
				values: { quantities, costs },
				errors,
				message: 'Not saved: check the fields marked.'
			});
		}
		return jobAction(async () => {
			await receiveOrder(user, event.params.id, orderId, lines);
			return { form: 'receive', orderId, saved: true };
		}, 'receive');
	}
};
