// Purchase orders: made from a job's materials list (one per supplier, lines not yet ordered),
// dated and noted, sent to the supplier as a PDF through the outbox (once, however often Send
// is pressed), and received with the quantities and cost that came. A job whose orders will not
// arrive before its first install day is flagged on the jobs calendar.
import { and, asc, eq, inArray, isNull, notInArray, sql } from 'drizzle-orm';
import { db } from '../platform/db';
import {
	itemSuppliers,
	jobDays,
	jobMaterials,
	jobs,
	priceListItems,
	properties,
	pumpModels,
	purchaseOrderLines,
	purchaseOrders,
	suppliers,
	type Job,
	type PurchaseOrder
} from '../platform/db/schema';
import { newId } from '../platform/crypto';
import type { SessionUser } from '../auth/sessions';
import { jobFor } from '../jobs/read';
import { JobError } from '../jobs/errors';
import { jobRef } from '../jobs/labels';
import { firmSettings } from '../platform/settings';
import { dispatchMail, writeMail } from '../platform/outbox';
import { htmlBody } from '../platform/mail';
import { arrivesLate, draftOrders, orderTotal } from '$lib/purchasing/orders';
import { purchaseOrderPdf } from './pdf';
import { formatCents } from '$lib/money';

export async function listSuppliers() {
	return db.select().from(suppliers).orderBy(asc(suppliers.name));
}

export async function addSupplier(input: { name: string; email: string; phone: string }) {
	const [row] = await db
		.insert(suppliers)
		.values({ id: newId(), ...input })
		.onConflictDoNothing({ target: suppliers.name })
		.returning();
	if (!row) throw new JobError('invalid', `There is already a supplier named ${input.name}.`);
	return row;
}

/** The supplier a price-list item is ordered from. */
export async function setItemSupplier(sku: string, supplierId: string) {
	const pump = sku.startsWith('pump:') ? sku.slice(5) : null;
	const [item] = pump
		? await db.select({ id: pumpModels.id }).from(pumpModels).where(eq(pumpModels.id, pump))
		: await db
				.select({ id: priceListItems.sku })
				.from(priceListItems)
				.where(eq(priceListItems.sku, sku));
	if (!item) throw new JobError('invalid', 'That item is not on the price list.');
	const [supplier] = await db
		.select({ id: suppliers.id })
		.from(suppliers)
		.where(eq(suppliers.id, supplierId));
	if (!supplier) throw new JobError('invalid', 'Pick a supplier from the list.');
	await db
		.insert(itemSuppliers)
		.values({ sku, supplierId })
		.onConflictDoUpdate({ target: itemSuppliers.sku, set: { supplierId } });
}

/** The job's material lines not yet on any order, with their item's supplier and cost. */
async function unordered(jobId: string) {
	const onOrder = db.select({ id: purchaseOrderLines.materialId }).from(purchaseOrderLines);
	return db
		.select({
			id: jobMaterials.id,
			sku: jobMaterials.sku,
			name: jobMaterials.name,
			description: jobMaterials.description,
			unit: jobMaterials.unit,
			quantity: jobMaterials.quantity,
			supplierId: itemSuppliers.supplierId,
			// A pump's cost from the pump list (materials lists name pumps 'pump:<id>').
			unitCostCents: sql<
				number | null
			>`coalesce(${priceListItems.unitCostCents}, ${pumpModels.costCents}, ${pumpModels.priceCents})`
		})
		.from(jobMaterials)
		.leftJoin(itemSuppliers, eq(itemSuppliers.sku, jobMaterials.sku))
		.leftJoin(priceListItems, eq(priceListItems.sku, jobMaterials.sku))
		.leftJoin(pumpModels, eq(sql`'pump:' || ${pumpModels.id}`, jobMaterials.sku))
		.where(and(eq(jobMaterials.jobId, jobId), notInArray(jobMaterials.id, onOrder)))
		.orderBy(asc(jobMaterials.sortOrder));
}

/** Makes the orders for what is not ordered yet: one per supplier. Returns how many were made. */
export async function makeOrders(user: SessionUser, jobId: string) {
	const job = await jobFor(user, jobId);
	return db.transaction(async (tx) => {
		// One maker at a time per job, so two clicks never order a line twice.
		await tx.select({ id: jobs.id }).from(jobs).where(eq(jobs.id, job.id)).for('update');
		const rows = await unordered(job.id);
		const { orders } = draftOrders(
			rows,
			(sku) => rows.find((r) => r.sku === sku)?.supplierId ?? undefined,
			(sku) => rows.find((r) => r.sku === sku)?.unitCostCents ?? 0
		);
		for (const o of orders) {
			const id = newId();
			await tx.insert(purchaseOrders).values({
				id,
				jobId: job.id,
				supplierId: o.supplierId,
				totalCents: o.totalCents,
				createdBy: user.id
			});
			await tx
				.insert(purchaseOrderLines)
				.values(o.lines.map((l) => ({ id: newId(), purchaseOrderId: id, ...l })));
		}
		return orders.length;
	});
}

async function orderOf(jobId: string, orderId: string) {
	const [order] = await db
		.select()
		.from(purchaseOrders)
		.where(and(eq(purchaseOrders.id, orderId), eq(purchaseOrders.jobId, jobId)));
	if (!order) throw new JobError('not_found', 'That purchase order is not on this job.');
	return order;
}

export async function updateOrder(
	user: SessionUser,
	jobId: string,
	orderId: string,
	input: { expectedOn: string | null; deliveryNote: string }
) {
	const job = await jobFor(user, jobId);
	const order = await orderOf(job.id, orderId);
	if (order.status === 'received') throw new JobError('bad_stage', 'This order has been received.');
	await db.update(purchaseOrders).set(input).where(eq(purchaseOrders.id, order.id));
}

/** Sends the order to its supplier with the PDF attached; a second press sends nothing more. */
/** The order as the supplier receives it: its lines, where it goes, its total and its PDF. */
async function renderOrder(job: Job, order: PurchaseOrder) {
	const [supplier] = await db.select().from(suppliers).where(eq(suppliers.id, order.supplierId));
	const lines = await db
		.select()
		.from(purchaseOrderLines)
		.where(eq(purchaseOrderLines.purchaseOrderId, order.id))
		.orderBy(asc(purchaseOrderLines.createdAt));
	const [property] = job.propertyId
		? await db.select().from(properties).where(eq(properties.id, job.propertyId))
		: [];
	const firm = await firmSettings();
	const deliverTo = property
		? [property.street, property.town, property.postalCode].filter(Boolean).join(', ')
		: '';
	const totalCents = orderTotal(lines);
	const pdf = await purchaseOrderPdf({
		firm: { name: firm.firmName, phone: firm.phone, email: firm.email },
		number: order.number,
		jobRef: jobRef(job.number),
		supplier: supplier.name,
		deliverTo,
		expectedOn: order.expectedOn,
		deliveryNote: order.deliveryNote,
		lines,
		totalCents
	});
	return { supplier, lines, deliverTo, totalCents, firm, pdf };
}

/** The order's PDF for the office to download: the same document the supplier is mailed. */
export async function orderPdf(user: SessionUser, jobId: string, orderId: string) {
	const job = await jobFor(user, jobId);
	const order = await orderOf(job.id, orderId);
	const { pdf } = await renderOrder(job, order);
	return { filename: `PO-${order.number}.pdf`, pdf };
}

export async function sendOrder(user: SessionUser, jobId: string, orderId: string) {
	const job = await jobFor(user, jobId);
	const order = await orderOf(job.id, orderId);
	if (order.status !== 'draft') {
		throw new JobError('bad_stage', `PO-${order.number} has already been sent.`);
	}
	const { supplier, lines, deliverTo, totalCents, firm, pdf } = await renderOrder(job, order);
	const paragraphs = [
		`Hello ${supplier.name},`,
		`Please find our purchase order PO-${order.number} attached: ${lines.length} line${lines.length === 1 ? '' : 's'}, ${formatCents(totalCents)} at our listed costs.`,
		`Needed by ${order.expectedOn ?? 'as soon as you can'}, delivered to ${deliverTo || 'the address we will send'}.`,
		...(order.deliveryNote ? [`Delivery note: ${order.deliveryNote}`] : []),
		`Please reply to confirm the date, or call ${firm.phone}.`
	];
	const outboxId = await db.transaction(async (tx) => {
		const [locked] = await tx
			.select()
			.from(purchaseOrders)
			.where(eq(purchaseOrders.id, order.id))
			.for('update');
		if (locked.status !== 'draft') return null;
		const id = await writeMail(
			{
				dedupeKey: `purchase-order:${order.id}:sent`,
				to: supplier.email,
				subject: `Purchase order PO-${order.number} from ${firm.firmName}`,
				text: [...paragraphs, '', `${firm.firmName} · ${firm.phone} · ${firm.email}`].join('\n\n'),
				html: htmlBody(paragraphs, undefined, `${firm.firmName} · ${firm.phone} · ${firm.email}`),
				attachments: [
					{
						filename: `PO-${order.number}.pdf`,
						content: Buffer.from(pdf).toString('base64'),
						contentType: 'application/pdf',
						encoding: 'base64'
					}
				],
				leadId: job.leadId
			},
			tx
		);
		await tx
			.update(purchaseOrders)
			.set({ status: 'sent', sentAt: new Date(), totalCents })
			.where(eq(purchaseOrders.id, order.id));
		// The job's materials list shows them ordered.
		await tx
			.update(jobMaterials)
			.set({ orderedAt: new Date() })
			.where(
				and(
					inArray(
						jobMaterials.id,
						lines.map((l) => l.materialId)
					),
					isNull(jobMaterials.orderedAt)
				)
			);
		return id;
	});
	if (outboxId) await dispatchMail(outboxId);
}

/** What came: quantities and cost per line; the order is then received. */
export async function receiveOrder(
	user: SessionUser,
	jobId: string,
	orderId: string,
	received: { lineId: string; quantity: number; costCents: number }[]
) {
	const job = await jobFor(user, jobId);
	const order = await orderOf(job.id, orderId);
	if (order.status === 'draft') {
		throw new JobError('bad_stage', 'Send the order before receiving it.');
	}
	await db.transaction(async (tx) => {
		for (const r of received) {
			const done = await tx
				.update(purchaseOrderLines)
				.set({ receivedQuantity: r.quantity, receivedCostCents: r.costCents })
				.where(
					and(eq(purchaseOrderLines.id, r.lineId), eq(purchaseOrderLines.purchaseOrderId, order.id))
				)
				.returning({ id: purchaseOrderLines.id });
			if (!done.length) throw new JobError('not_found', 'That line is not on this order.');
		}
		await tx
			.update(purchaseOrders)
			.set({ status: 'received', receivedAt: new Date() })
			.where(eq(purchaseOrders.id, order.id));
	});
}

/** The job's orders with their supplier and lines, and what is still to order. */
export async function ordersOfJob(jobId: string) {
	const orders = await db
		.select({ order: purchaseOrders, supplier: suppliers.name, email: suppliers.email })
		.from(purchaseOrders)
		.innerJoin(suppliers, eq(suppliers.id, purchaseOrders.supplierId))
		.where(eq(purchaseOrders.jobId, jobId))
		.orderBy(asc(purchaseOrders.number));
	const lines = orders.length
		? await db
				.select()
				.from(purchaseOrderLines)
				.where(
					inArray(
						purchaseOrderLines.purchaseOrderId,
						orders.map((o) => o.order.id)
					)
				)
				.orderBy(asc(purchaseOrderLines.createdAt))
		: [];
	const pending = await unordered(jobId);
	return {
		orders: orders.map((o) => ({
			...o.order,
			supplier: o.supplier,
			email: o.email,
			lines: lines.filter((l) => l.purchaseOrderId === o.order.id)
		})),
		unordered: pending
	};
}

/** Received cost per material line (the costing page uses it when no invoice cost is typed). */
export async function receivedCosts(jobId: string) {
	return db
		.select({
			materialId: purchaseOrderLines.materialId,
			costCents: purchaseOrderLines.receivedCostCents
		})
		.from(purchaseOrderLines)
		.innerJoin(purchaseOrders, eq(purchaseOrders.id, purchaseOrderLines.purchaseOrderId))
		.where(and(eq(purchaseOrders.jobId, jobId), eq(purchaseOrders.status, 'received')));
}

/**
 * Jobs among these whose materials will not be on site before the first install day: an order
 * not received and expected on that day or later, or with no date yet.
 */
export async function lateMaterials(jobIds: string[]): Promise<Map<string, string>> {
	const out = new Map<string, string>();
	if (!jobIds.length) return out;
	const days = await db
		.select({ jobId: jobDays.jobId, day: jobDays.day })
		.from(jobDays)
		.where(inArray(jobDays.jobId, jobIds))
		.orderBy(asc(jobDays.day));
	const orders = await db
		.select({
			jobId: purchaseOrders.jobId,
			number: purchaseOrders.number,
			status: purchaseOrders.status,
			expectedOn: purchaseOrders.expectedOn
		})
		.from(purchaseOrders)
		.where(inArray(purchaseOrders.jobId, jobIds));
	for (const jobId of jobIds) {
		const first = days.find((d) => d.jobId === jobId)?.day;
		if (!first) continue;
		const late = orders.filter(
			(o) => o.jobId === jobId && o.status !== 'received' && arrivesLate(o.expectedOn, first)
		);
		if (late.length) {
			out.set(
				jobId,
				late
					.map((o) => `PO-${o.number} ${o.expectedOn ? `expected ${o.expectedOn}` : 'has no date'}`)
					.join('; ')
			);
		}
	}
	return out;
}
