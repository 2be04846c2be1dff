import { beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { PDFDocument } from 'pdf-lib';
import { db } from '$lib/server/platform/db';
import {
	jobDays,
	jobMaterials,
	outbox,
	priceListItems,
	pumpModels,
	purchaseOrders
} from '$lib/server/platform/db/schema';
import { newId } from '$lib/server/platform/crypto';
import type { SessionUser } from '$lib/server/auth/sessions';
import { JobError } from '$lib/server/jobs/errors';
import { deliverOutboxMessage } from '$lib/server/platform/outbox';
import {
	addSupplier,
	lateMaterials,
	makeOrders,
	ordersOfJob,
	receiveOrder,
	sendOrder,
	setItemSupplier,
	updateOrder
} from '$lib/server/purchasing/orders';
import { resetDatabase } from '../support/database';
import { clearMail, waitForMail } from '../support/mailbox';
import { makeUser, seedFirm } from './fixtures';
import { makeHandJob } from './costing-fixtures';
import { costingOf } from '$lib/server/costing/report';
import { GET as orderPdfGet } from '../../src/routes/office/jobs/[id]/purchasing/[orderId]/pdf/+server';

/** The office's download of an order's PDF, as the given staff member. */
async function downloadPdf(user: SessionUser, jobId: string, orderId: string) {
	const url = new URL(`http://localhost/office/jobs/${jobId}/purchasing/${orderId}/pdf`);
	const event = { locals: { user }, url, params: { id: jobId, orderId } };
	return orderPdfGet(event as never);
}

let owner: SessionUser;

beforeEach(async () => {
	await resetDatabase();
	await clearMail();
	await seedFirm();
	owner = await makeUser('owner');
	await db.insert(priceListItems).values([
		{
			sku: 'STONE-BASALT-COL',
			name: 'Basalt column',
			category: 'stone',
			unit: 'ton',
			unitCostCents: 60_000,
			unitPriceCents: 95_000
		},
		{
			sku: 'AGG-PEBBLE-RIVER',
			name: 'River pebble',
			category: 'aggregate',
			unit: 'ton',
			unitCostCents: 4_567,
			unitPriceCents: 9_000
		}
	]);
	await db.insert(pumpModels).values({
		id: 'pump-s2600',
		name: 'Submersible pump S-2600',
		curve: [
			{ flowGph: 0, headFt: 20 },
			{ flowGph: 2600, headFt: 0 }
		],
		watts: 180,
		priceCents: 52_000,
		costCents: 29_000
	});
});

describe('purchase orders', () => {
	it('makes one order per supplier with the right totals, sends the PDF once and flags a late delivery', async () => {
		const { job } = await makeHandJob();
		const quarry = await addSupplier({
			name: 'Granite Hollow Quarry',
			email: 'orders@granitehollow.example',
			phone: ''
		});
		const pondShop = await addSupplier({
			name: 'Reedbank Pond Supply',
			email: 'desk@reedbank.example',
			phone: ''
		});
		await setItemSupplier('STONE-BASALT-COL', quarry.id);
		await setItemSupplier('AGG-PEBBLE-RIVER', quarry.id);
		await setItemSupplier('pump:pump-s2600', pondShop.id);
		await expect(setItemSupplier('NO-SUCH-SKU', quarry.id)).rejects.toThrow(JobError);

		expect(await makeOrders(owner, job.id)).toBe(2);
		// Pressed again: every line is already on an order.
		expect(await makeOrders(owner, job.id)).toBe(0);
		const { orders, unordered } = await ordersOfJob(job.id);
		expect(unordered).toEqual([]);
		// Hand-worked at cost: basalt 0.8 ton × 600.00 = 480.00; pebble 2 ton × 45.67 = 91.34
		// → quarry 571.34; the pump 1 × 290.00 (the pump list's cost).
		const byName = Object.fromEntries(orders.map((o) => [o.supplier, o]));
		expect(byName['Granite Hollow Quarry'].lines.map((l) => l.extendedCents)).toEqual([
			48_000, 9_134
		]);
		expect(byName['Granite Hollow Quarry'].totalCents).toBe(57_134);
		expect(byName['Reedbank Pond Supply'].totalCents).toBe(29_000);

		const po = byName['Granite Hollow Quarry'];
		await updateOrder(owner, job.id, po.id, {
			expectedOn: '2027-06-10',
			deliveryNote: 'Gate on the north side; call on arrival'
		});
		await db.insert(jobDays).values({ id: newId(), jobId: job.id, day: '2027-06-10' });
		// Expected on the install day itself: too late for the crew.
		expect((await lateMaterials([job.id])).get(job.id)).toMatch(
			new RegExp(`PO-${po.number} expected 2027-06-10`)
		);

		await sendOrder(owner, job.id, po.id);
		await expect(sendOrder(owner, job.id, po.id)).rejects.toThrow(/already been sent/);
		const mails = await db
			.select()
			.from(outbox)
			.where(eq(outbox.to, 'orders@granitehollow.example'));
		expect(mails).toHaveLength(1);
		const pdfBytes = Buffer.from(mails[0].attachments[0].content, 'base64');
		expect(pdfBytes.subarray(0, 5).toString()).toBe('%PDF-');
		const parsed = await PDFDocument.load(pdfBytes);
		expect(parsed.getPageCount()).toBe(1);
		expect(parsed.getTitle()).toBe(`Purchase order PO-${po.number}`);
		await deliverOutboxMessage(mails[0].id);
		const mail = await waitForMail('orders@granitehollow.example', new RegExp(`PO-${po.number}`));
		expect(mail.attachments?.map((a) => [a.filename, a.contentType])).toEqual([
			[`PO-${po.number}.pdf`, 'application/pdf']
		]);
		expect(mail.text).toContain('$571.34');
		// The materials list shows the sent lines ordered.
		const lines = await db.select().from(jobMaterials).where(eq(jobMaterials.jobId, job.id));
		expect(
			lines
				.filter((l) => l.orderedAt)
				.map((l) => l.sku)
				.sort()
		).toEqual(['AGG-PEBBLE-RIVER', 'STONE-BASALT-COL']);

		// Received: the flag goes.
		await receiveOrder(
			owner,
			job.id,
			po.id,
			po.lines.map((l) => ({
				lineId: l.id,
				quantity: l.quantity,
				costCents: l.extendedCents + 500
			}))
		);
		const [received] = await db.select().from(purchaseOrders).where(eq(purchaseOrders.id, po.id));
		expect(received.status).toBe('received');
		// The costing page takes the received cost until the supplier's invoice is typed:
		// basalt 48000 + 500, pebble 9134 + 500, the pump (not received) at its estimate 29000.
		const { costing } = await costingOf(job);
		expect(costing.materials.rows.map((r) => [r.actualCostCents, r.basis])).toEqual([
			[48_500, 'invoice'],
			[9_634, 'invoice'],
			[29_000, 'estimate']
		]);
		// The other order has no date yet: only it is flagged now, and once it is due the day
		// before the install, nothing is.
		const other = byName['Reedbank Pond Supply'];
		expect((await lateMaterials([job.id])).get(job.id)).toBe(`PO-${other.number} has no date`);
		await updateOrder(owner, job.id, other.id, { expectedOn: '2027-06-09', deliveryNote: '' });
		expect((await lateMaterials([job.id])).has(job.id)).toBe(false);
	});

	it('lets the office download an order as a PDF named by its number', async () => {
		const { job } = await makeHandJob();
		const quarry = await addSupplier({
			name: 'Granite Hollow Quarry',
			email: 'orders@granitehollow.example',
			phone: ''
		});
		await setItemSupplier('STONE-BASALT-COL', quarry.id);
		await setItemSupplier('AGG-PEBBLE-RIVER', quarry.id);
		await setItemSupplier('pump:pump-s2600', quarry.id);
		await makeOrders(owner, job.id);
		const [po] = (await ordersOfJob(job.id)).orders;
		const sales = await makeUser('sales', 'sales@test.example', 'Sam');
		const res = await downloadPdf(sales, job.id, po.id);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/pdf');
		const disposition = res.headers.get('content-disposition') ?? '';
		expect(disposition).toMatch(/^attachment;/);
		expect(disposition).toContain(`PO-${po.number}.pdf`);
		const bytes = new Uint8Array(await res.arrayBuffer());
		expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-');
		const doc = await PDFDocument.load(bytes);
		expect(doc.getTitle()).toBe(`Purchase order PO-${po.number}`);
		// Downloading does not send it: the order stays a draft, no mail is written.
		expect((await ordersOfJob(job.id)).orders[0].status).toBe('draft');
		expect(await db.select().from(outbox).where(eq(outbox.to, quarry.email))).toEqual([]);
		// An order of another job (or none) is not found; crew may not download orders.
		await expect(downloadPdf(owner, job.id, 'no-such-order')).rejects.toMatchObject({
			status: 404
		});
		const crew = await makeUser('crew', 'crew@test.example', 'Rosa');
		await expect(downloadPdf(crew, job.id, po.id)).rejects.toMatchObject({ status: 403 });
	});
});
